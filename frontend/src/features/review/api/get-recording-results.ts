import type { RecordingResultsDto } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/recordings/:recordingId/results`: the latest run's results. */
export const recordingResultsKey = (recordingId: string) =>
  `/api/recordings/${encodeURIComponent(recordingId)}/results`;

export function getRecordingResults(recordingId: string): Promise<RecordingResultsDto> {
  return apiFetch<RecordingResultsDto>(recordingResultsKey(recordingId));
}

/** `runId` is part of the cache entry so that a new run replaces the old results at once. */
export function useRecordingResults(recordingId: string | null, runId: string | null) {
  return useSWR<RecordingResultsDto>(
    recordingId === null || runId === null ? null : [recordingResultsKey(recordingId), runId],
    () => getRecordingResults(recordingId ?? ''),
  );
}
