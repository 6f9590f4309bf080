import { SETTLED_RECORDING_STATES } from '@gyre/shared';
import type { Page, RecordingDto, RecordingState } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** How often the list is asked again while a recording is still on its way (ms). */
export const RECORDINGS_POLL_MS = 1500;

/** `GET /api/recordings?visitId=`: the visit's recordings, newest first. */
export function recordingsKey(visitId: string): string {
  return withQuery('/api/recordings', { visitId, pageSize: 200, sort: 'createdAt', order: 'desc' });
}

export function getRecordings(visitId: string): Promise<Page<RecordingDto>> {
  return apiFetch<Page<RecordingDto>>(recordingsKey(visitId));
}

export function isSettled(state: RecordingState): boolean {
  return SETTLED_RECORDING_STATES.includes(state);
}

/** The visit's recordings, asked again every 1.5 s while any is still on its way. */
export function useRecordings(visitId: string | null) {
  return useSWR<Page<RecordingDto>>(
    visitId === null ? null : recordingsKey(visitId),
    () => getRecordings(visitId ?? ''),
    {
      refreshInterval: (latest) =>
        latest?.items.some((recording) => !isSettled(recording.state)) ? RECORDINGS_POLL_MS : 0,
    },
  );
}
