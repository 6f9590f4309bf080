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
}

/** `GET /api/audit/verify`. */
export interface AuditVerifyResult {
  intact: boolean;
  /** Entries checked, in sequence order. */
  checked: number;
  /** The first entry whose stored hash, link or sequence number does not hold. */
  firstBroken: { seq: number; reason: string } | null;
  lastHash: string | null;
}
