/** Audit actions Gyre writes; feature modules may add their own verbs (e.g. `sign`, `rerun`). */
export const AUDIT_ACTIONS = [
  'create',
  'update',
  'delete',
  'sign-in',
  'sign-in-failed',
  'sign-out',
  'account-locked',
  'refresh-reuse',
  'password-change',
  'password-reset-request',
  'password-reset',
  'invite',
  'invitation-accepted',
  'role-change',
  'export',
] as const;
export type KnownAuditAction = (typeof AUDIT_ACTIONS)[number];

/** One entry of the audit trail as `GET /api/audit` shows it. */
export interface AuditEntryView {
  seq: number;
  at: string;
  actorId: string | null;
  actorEmail: string | null;
  action: string;
  objectType: string;
  objectId: string | null;
  studyId: string | null;
  siteId: string | null;
  before: unknown;
  after: unknown;
  reason: string | null;
  clientIp: string | null;
  prevHash: string;
  hash: string;
  /**
   * What the entry is about, in the reader's words (`GET /api/audit` only; never part of the
   * hash). Each name is given only when the reader may read the row it comes from.
   */
  context?: AuditEntryContext;
}

/** The names and links behind an audit entry's ids, resolved for the reader's scope. */
export interface AuditEntryContext {
  /** The acting user's display name; null for the system or a user out of the reader's scope. */
  actorName: string | null;
  participantId: string | null;
  participantCode: string | null;
  visitId: string | null;
  visitLabel: string | null;
  /** `task` or `resting` when the entry is about a recording or a run. */
  recordingKind: string | null;
  /** Display names of the users the entry names (its object, `…ById` fields), by user id. */
  people: Record<string, string>;
}

/** `GET /api/audit/verify`. */
export interface AuditVerifyResult {
  /** The chain holds and agrees with every signed checkpoint. */
  intact: boolean;
  /** Entries checked, in sequence order. */
  checked: number;
  /**
   * The first entry whose stored hash, link or sequence number does not hold, or (when the
   * chain itself holds) the first entry a signed checkpoint shows was deleted or rewritten.
   */
  firstBroken: { seq: number; reason: string } | null;
  lastHash: string | null;
  /** The trail against the signed checkpoints kept outside the database. */
  anchors: AuditAnchorsCheck;
}

/** One signed checkpoint of the audit chain: its newest entry when the line was written. */
export interface AuditCheckpointView {
  /** Line number in the anchor file (1 = first). */
  line: number;
  seq: number;
  hash: string;
  at: string;
}

/** The checks of `GET /api/audit/verify` against the anchor file (`audit-anchors.jsonl`). */
export interface AuditAnchorsCheck {
  /** Every line is signed with Gyre's anchor key, links to the line before, and matches the table. */
  intact: boolean;
  /** Lines of the anchor file read. */
  checkpoints: number;
  /** The newest correctly signed checkpoint. */
  latest: AuditCheckpointView | null;
  /** Entries written after the newest checkpoint (not anchored yet). */
  unanchored: number;
  /** SHA-256 (hex) of the public anchor key (SubjectPublicKeyInfo DER) the lines were checked with. */
  keyFingerprint: string | null;
  /** Each finding in plain words; empty when intact. */
  problems: string[];
}
