/**
 * API types of report sign-off (21 CFR Part 11 §11.50, §11.200 in spirit): signed revisions,
 * the sign-off state of a visit's report, and the signing request.
 */
import type { ReportView } from './recordings';

/** The one meaning a Gyre signature has; the signer confirms it word for word. */
export const SIGNATURE_MEANING = 'reviewed and approved for the study record';

/** A signed revision never changes; `sent` once every coordinator's e-mail was delivered. */
export const REVISION_STATES = ['signed', 'sent'] as const;
export type RevisionState = (typeof REVISION_STATES)[number];

export interface ReportRevisionView {
  id: string;
  reportId: string;
  visitId: string;
  participantId: string;
  siteId: string;
  /** 1, 2, …: a new revision follows new results or a changed flag after signing. */
  revision: number;
  state: RevisionState;
  participantCode: string;
  visitLabel: string;
  visitDate: string;
  signedById: string;
  signerName: string;
  signedAt: string;
  meaning: string;
  /** SHA-256 of the stored PDF, hex; the file is checked against it on every download. */
  pdfSha256: string;
  pdfSizeBytes: number;
  /** The revision this one replaces, if any. */
  supersedesId: string | null;
  /** When the last coordinator e-mail of this revision was delivered. */
  sentAt: string | null;
}

/** `GET /api/visits/:visitId/report/sign-off`: what an analyst needs before signing. */
export interface ReportSignOffView {
  report: ReportView;
  meaning: string;
  /** SHA-256 over the draft's content; send it back when signing. Null: nothing analysed yet. */
  draftFingerprint: string | null;
  /** The number the next signature would give; null when there is nothing new to sign. */
  pendingRevision: number | null;
  /** True when results exist and differ from the latest signed revision (or none is signed). */
  canSign: boolean;
  /** Why signing is not possible now, in words; null when it is. */
  cannotSignReason: string | null;
  /** Signed revisions, newest first. */
  revisions: ReportRevisionView[];
}

/** `POST /api/visits/:visitId/report/sign`. */
export interface SignReportRequest {
  /** The signer's password, entered again (§11.200(a)(1)). */
  password: string;
  /** Must equal {@link SIGNATURE_MEANING}. */
  meaning: string;
  /** The `draftFingerprint` of the previewed draft: signing refuses if the visit changed since. */
  fingerprint: string;
}
