import type { RecordingView } from '@gyre/shared';
import { useRecordingResults } from '../api/get-recording-results';

/** States in which a recording is on its way; its last results stay on screen meanwhile. */
export const IN_PROGRESS: ReadonlySet<RecordingView['state']> = new Set([
  'received',
  'validating',
  'queued',
  'computing',
]);

/** The results Review shows for a recording: its latest run's, while ready or recomputing. */
export function useShownResults(recording: RecordingView | null) {
  const showable =
    recording !== null &&
    recording.latestRunId !== null &&
    (recording.state === 'ready' || IN_PROGRESS.has(recording.state));
  const results = useRecordingResults(
    showable ? recording.id : null,
    showable ? recording.latestRunId : null,
  );
  return { showable, results };
}
