import { SETTLED_RECORDING_STATES } from '@gyre/shared';
import type { Page, RecordingView, RecordingState } from '@gyre/shared';
import useSWR from 'swr';
import type { SWRConfiguration } from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** How often the list is asked again while a recording is on its way and no live stream runs (ms). */
export const RECORDINGS_POLL_MS = 1500;

/**
 * The first element of Intake's key: the cached value is a whole page. Review reads the same
 * address into an array under a key of its own, so the two shapes never share a cache entry.
 */
export const RECORDINGS_PAGE_KEY = 'intake/recordings-page';

/** The address of a visit's recordings, newest first. */
export function recordingsPath(visitId: string): string {
  return withQuery('/api/recordings', { visitId, pageSize: 200, sort: 'createdAt', order: 'desc' });
}

/** `GET /api/recordings?visitId=`: the SWR key of the visit's recordings (a page). */
export function recordingsKey(visitId: string): readonly [string, string] {
  return [RECORDINGS_PAGE_KEY, recordingsPath(visitId)];
}

/** Whether an SWR key is one of Intake's recording pages (for mutate filters). */
export function isRecordingsKey(key: unknown): boolean {
  return Array.isArray(key) && key[0] === RECORDINGS_PAGE_KEY;
}

export function getRecordings(visitId: string): Promise<Page<RecordingView>> {
  return apiFetch<Page<RecordingView>>(recordingsPath(visitId));
}

export function isSettled(state: RecordingState): boolean {
  return SETTLED_RECORDING_STATES.includes(state);
}

/**
 * The visit's recordings. By default asked again every 1.5 s while any is still on its way;
 * a caller that follows them live passes its own `refreshInterval`.
 */
export function useRecordings(
  visitId: string | null,
  options: Pick<SWRConfiguration<Page<RecordingView>>, 'refreshInterval'> = {},
) {
  return useSWR<Page<RecordingView>>(
    visitId === null ? null : recordingsKey(visitId),
    () => getRecordings(visitId ?? ''),
    {
      refreshInterval: (latest) =>
        latest?.items.some((recording) => !isSettled(recording.state)) ? RECORDINGS_POLL_MS : 0,
      ...options,
    },
  );
}
