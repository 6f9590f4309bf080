import type { ReportState } from './recordings';
import type { VisitScheduleStatus } from './visit-schedule';

/**
 * A participant code: upper-case letters and digits in hyphen-separated groups, with at least
 * one digit, 3–24 characters (e.g. `AC-0042`). A personal name can never match it.
 */
export const PARTICIPANT_CODE_PATTERN = /^(?=.{3,24}$)(?=[^\d]*\d)[A-Z0-9]+(?:-[A-Z0-9]+)*$/;
/** Study and site codes: upper-case letters, digits and hyphens, 2–32 characters. */
export const STUDY_CODE_PATTERN = /^[A-Z0-9](?:[A-Z0-9-]{0,30}[A-Z0-9])?$/;

/** Defaults of the study's trend settings (see {@link StudyView}). */
export const DEFAULT_TREND_MIN_VISITS = 3;
export const DEFAULT_TREND_MIN_SPAN_DAYS = 90;

export interface StudyView {
  id: string;
  code: string;
  name: string;
  description: string;
  /** A participant's trend slope is shown from this many visits with a value (≥ 2). */
  trendMinVisits: number;
  /** … and when those visits span at least this many days. */
  trendMinSpanDays: number;
  /**
   * Blinded review: while true, analysts see each visit under its code, without its date,
   * planned-visit name, group or the participant's other visits, until they record their
   * decision on it. Admins change it (audited, with a reason).
   */
  blindedReview: boolean;
  createdAt: string;
  updatedAt: string;
}

export interface SiteView {
  id: string;
  studyId: string;
  code: string;
  name: string;
  createdAt: string;
  updatedAt: string;
}

export interface ParticipantView {
  id: string;
  studyId: string;
  siteId: string;
  code: string;
  /** `YYYY-MM-DD`; day 0 of the visit schedule. Null for participants registered before it existed. */
  enrolmentDate: string | null;
  /** The participant's group (arm) in the study, if any. */
  groupId: string | null;
  createdAt: string;
  updatedAt: string;
}

/** A visit's latest value of one measure in the participants list. */
export interface LatestValue {
  /** Hz. */
  hz: number;
  visitId: string;
  visitLabel: string;
}

/**
 * One row of `GET /api/participants`: the participant with what the list shows of its visits.
 * Result, flag and report fields are null when the caller's role may not read those.
 */
export interface ParticipantListItem extends ParticipantView {
  /** The site's full name (as every other screen names it). */
  siteName: string;
  groupName: string | null;
  visitCount: number;
  /** PAF of the newest visit (by date) whose current resting recording has one. */
  latestPaf: LatestValue | null;
  /** Region Δf of the newest visit (by date) whose current task recording has one. */
  latestDeltaF: LatestValue | null;
  /** Flags raised and not cleared over all visits; null: the role does not read flags. */
  openFlags: number | null;
  /** The newest visit by date; null before the first visit. */
  latestVisit: {
    id: string;
    label: string;
    visitDate: string;
    /** Null: no report yet, or none the caller may read. */
    report: { state: ReportState; latestRevision: number | null } | null;
  } | null;
}

export interface VisitView {
  id: string;
  participantId: string;
  studyId: string;
  siteId: string;
  /** The planned visit's name when one was picked; otherwise as registered. */
  label: string;
  /** `YYYY-MM-DD`. */
  visitDate: string;
  plannedVisitId: string | null;
  /** Where the visit falls in the study's schedule (computed by `visitScheduleStatus`). */
  schedule: VisitScheduleStatus;
  createdAt: string;
  updatedAt: string;
}

/** How a decision on a blinded visit is recorded: a slowing flag raised, or no flag. */
export const BLINDED_DECISIONS = ['flag', 'noFlag'] as const;
export type BlindedDecision = (typeof BLINDED_DECISIONS)[number];

/** Body of `POST /api/visits/:visitId/blinding/decision`. */
export interface BlindedDecisionChange {
  decision: BlindedDecision;
  /** Why, in words (10–2000 characters); a raised flag takes it as its reason. */
  reason: string;
}

/** The decision an analyst recorded on a blinded visit, which unblinded it for them. */
export interface BlindedDecisionView {
  decision: BlindedDecision;
  reason: string;
  /** The flag raised (or already raised) with a `flag` decision. */
  flagId: string | null;
  decidedAt: string;
}

/**
 * `GET /api/visits/:visitId/blinding`: whether the visit's details are hidden from the caller.
 * Only analysts of a study with blinded review on are ever blinded.
 */
export interface VisitBlindingView {
  visitId: string;
  studyId: string;
  /** The visit's blinded-review code (e.g. `B-7KQ2`); null while the study is not blinded. */
  code: string | null;
  /** True while the caller sees the visit under its code only. */
  blinded: boolean;
  /** The caller's own decision that unblinded the visit for them, if any. */
  decision: BlindedDecisionView | null;
}
