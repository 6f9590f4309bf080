import type { RecordingResultsView } from '@gyre/shared';
import { apiFetch, withQuery } from '../../../lib/api-client';
import { useRead } from '../../../lib/use-read';

/** `GET /api/recordings/:recordingId/results?runId=`: one run's results (the latest without runId). */
export const recordingResultsKey = (recordingId: string, runId: string) =>
  withQuery(`/api/recordings/${encodeURIComponent(recordingId)}/results`, { runId });

export function getRecordingResults(
  recordingId: string,
  runId: string,
): Promise<RecordingResultsView> {
  return apiFetch<RecordingResultsView>(recordingResultsKey(recordingId, runId));
}

/** Asked by run, so that a new run is a new cache entry and old results never linger under it. */
export function useRecordingResults(recordingId: string | null, runId: string | null) {
  return useRead<RecordingResultsView>(
    recordingId === null || runId === null ? null : recordingResultsKey(recordingId, runId),
  );
}
