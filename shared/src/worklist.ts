import type { RecordingKind } from './recordings';
import type { VisitScheduleStatus } from './visit-schedule';

/*
 * The worklist (`GET /api/worklist`) and the "visit reviewed" act
 * (`GET`/`POST /api/visits/:visitId/review`).
 */

/** Sections of the analysts' and monitors' worklist (the whole study). */
export const REVIEW_SECTIONS = [
  'unreviewed',
  'suggestions',
  'awaitingSignature',
  'changedSinceSigning',
  'failed',
] as const;

/** Sections of a technician's worklist (their own site's uploads). */
export const UPLOAD_SECTIONS = ['rejected', 'warnings', 'missingKinds', 'failed'] as const;

export type ReviewSectionKey = (typeof REVIEW_SECTIONS)[number];
export type UploadSectionKey = (typeof UPLOAD_SECTIONS)[number];
export type WorklistSectionKey = ReviewSectionKey | UploadSectionKey;

/** `?sort=`: oldest first (the default: whatever waits longest), newest first, or by participant code. */
export const WORKLIST_SORTS = ['oldest', 'newest', 'participant'] as const;
export type WorklistSort = (typeof WORKLIST_SORTS)[number];

/** Items per section when `?limit=` is not given, and the most `?limit=` may ask for. */
export const WORKLIST_DEFAULT_LIMIT = 25;
export const WORKLIST_MAX_LIMIT = 200;

/** Where an item leads: the visit's Review screen, or Intake with the visit chosen. */
export interface WorklistLink {
  screen: 'review' | 'intake';
  /** Null on a blinded item (the participant leads to their other visits). */
  participantId: string | null;
  visitId: string;
}

export interface WorklistItem {
  /** Unique within its section (a visit id, or a recording id for recording items). */
  key: string;
  /** Null on a blinded item (see `blindCode`). */
  participantId: string | null;
  participantCode: string | null;
  visitId: string;
  /** The visit's label; on a blinded item its code. */
  visitLabel: string;
  /** `YYYY-MM-DD`; null on a blinded item. */
  visitDate: string | null;
  /** The visit's place in the study's schedule, as its visit view has it (window status); null on a blinded item. */
  schedule: VisitScheduleStatus | null;
  /**
   * Set while the visit is blinded for the caller (blinded review): its code; the participant,
   * date, planned visit and schedule are then left out of the item.
   */
  blindCode: string | null;
  siteId: string;
  /** Set for items about one recording (failed, rejected, with warnings, a missing kind). */
  kind: RecordingKind | null;
  recordingId: string | null;
  /** What needs doing or what happened, in a short sentence. */
  what: string;
  /**
   * Since when the item has been waiting (ISO timestamp or `YYYY-MM-DD` for a visit date).
   * Under blinded review a time is on the visit's blinded clock (from its first upload), and a
   * visit date is null: no upload may exist to count from, and the date would give it away.
   */
  since: string | null;
  link: WorklistLink;
}

export interface WorklistSection {
  key: WorklistSectionKey;
  title: string;
  /** The true number of items in the section; `items` holds at most `limit` of them. */
  total: number;
  items: WorklistItem[];
}

export interface WorklistView {
  /** `review`: analysts and monitors (the study); `uploads`: technicians (their site). */
  kind: 'review' | 'uploads';
  /** True when the caller may not mark visits reviewed (monitors): the list is to read. */
  readOnly: boolean;
  sort: WorklistSort;
  limit: number;
  offset: number;
  generatedAt: string;
  sections: WorklistSection[];
}

/** Query of `GET /api/worklist`. */
export interface WorklistQuery {
  sort?: WorklistSort;
  /** Items per section (1…WORKLIST_MAX_LIMIT). */
  limit?: number;
  /** Items to skip in every section (for paging through one section). */
  offset?: number;
  /** Only this section (others are left out of the answer). */
  section?: WorklistSectionKey;
}

/** One "visit reviewed" act: who reviewed which current results, when. */
export interface VisitReviewView {
  id: string;
  visitId: string;
  reviewedById: string;
  /** The reviewer's name at the time (kept even if the account is renamed). */
  reviewedByName: string;
  reviewedAt: string;
  /** SHA-256 over the visit's current analysis runs when reviewed (see `runIds`). */
  fingerprint: string;
  /** The runs reviewed, as `kind:runId`, sorted. */
  runIds: string[];
}

/** `GET /api/visits/:visitId/review`: what the Review screen shows about the act. */
export interface VisitReviewStateView {
  visitId: string;
  /** Fingerprint of the visit's current results; null when it has none. */
  currentFingerprint: string | null;
  /** The current runs, as `kind:runId`, sorted. */
  currentRunIds: string[];
  /** The latest review of the visit, whether or not it still holds. */
  latest: VisitReviewView | null;
  /** True while the latest review's fingerprint equals the current one. */
  reviewed: boolean;
  /** True when the visit was reviewed but its results have changed since. */
  changedSinceReview: boolean;
  /** Whether the caller may mark the visit reviewed now, and if not, why. */
  canReview: boolean;
  cannotReviewReason: string | null;
}

/** Body of `POST /api/visits/:visitId/review`: the fingerprint of the results the analyst saw. */
export interface MarkVisitReviewed {
  fingerprint: string;
}
