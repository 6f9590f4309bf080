import type { RecordingKind } from '@gyre/shared';

/** Events the analysis modules announce; listeners live with whoever reacts. */
export const AnalysisEvents = {
  /** A visit's analysis override got a new revision. */
  VisitOverrideChanged: 'analysis.visit-override-changed',
  /** A recording of the visit has new numbers, or its current numbers changed source. */
  VisitResultsChanged: 'analysis.visit-results-changed',
} as const;

export interface VisitOverrideChanged {
  visitId: string;
  revision: number;
  actor: { id: string; email: string };
  reason: string;
}

/**
 * A computation of a visit's recording finished. `numbersChanged` is false when the run
 * reproduced the recording's current numbers exactly (then no new run was stored). For a
 * resting recording, `iafHz` is the IAF it found (PAF, else CoG).
 */
export interface VisitResultsChanged {
  visitId: string;
  studyId: string;
  siteId: string;
  participantId: string;
  recordingId: string;
  kind: RecordingKind;
  runId: string;
  numbersChanged: boolean;
  iafHz: number | null;
}
