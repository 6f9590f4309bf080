/**
 * A participant code: upper-case letters and digits in hyphen-separated groups, with at least
 * one digit, 3–24 characters (e.g. `AC-0042`). A personal name can never match it.
 */
export const PARTICIPANT_CODE_PATTERN = /^(?=.{3,24}$)(?=[^\d]*\d)[A-Z0-9]+(?:-[A-Z0-9]+)*$/;
/** Study and site codes: upper-case letters, digits and hyphens, 2–32 characters. */
export const STUDY_CODE_PATTERN = /^[A-Z0-9](?:[A-Z0-9-]{0,30}[A-Z0-9])?$/;

export interface StudyView {
  id: string;
  code: string;
  name: string;
  description: string;
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
  createdAt: string;
  updatedAt: string;
}

export interface VisitView {
  id: string;
  participantId: string;
  studyId: string;
  siteId: string;
  label: string;
  /** `YYYY-MM-DD`. */
  visitDate: string;
  createdAt: string;
  updatedAt: string;
}
