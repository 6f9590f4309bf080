import type { RecordingKind, RunTrigger } from '@gyre/shared';
import type { Recording } from './recording.entity';

/** The queue lane computations of recordings run in. */
export const ANALYSIS_LANE = 'analysis';

/** Events the recordings module announces after its transaction commits. */
export const RecordingEvents = {
  /** A computation job was queued: whoever runs jobs should look. */
  ComputationQueued: 'recordings.computation-queued',
  /** A recording of a visit was replaced by a newer one of the same kind. */
  Superseded: 'recordings.superseded',
} as const;

export interface RecordingSuperseded {
  visitId: string;
  kind: RecordingKind;
}

/** A computation job's payload: ids only, so the job can run anywhere. */
export interface ComputationPayload {
  recordingId: string;
  trigger: RunTrigger;
  /** Null for automatic computations (a changed resting IAF, a restart). */
  requestedById: string | null;
  reason: string | null;
}

/** What a computation needs of the recording it computes. */
export interface ComputationInput {
  recording: Recording;
  filePath: string;
  csvOnsets: Array<{ onsetS: number; label: string }> | null;
}
