import { SETTLED_RECORDING_STATES } from '@gyre/shared';
import type { Page, RecordingView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

const visitRecordingsPath = (visitId: string) =>
  withQuery('/api/recordings', { visitId, pageSize: 200, sort: 'createdAt', order: 'desc' });

/**
 * `GET /api/recordings?visitId=`: the visit's resting and task recordings, newest first. The
 * cached value is an array, so the key says so: Intake caches the same address as a page.
 */
export const visitRecordingsKey = (visitId: string) =>
  ['review/visit-recordings', visitRecordingsPath(visitId)] as const;

export async function getVisitRecordings(visitId: string): Promise<RecordingView[]> {
  const page = await apiFetch<Page<RecordingView>>(visitRecordingsPath(visitId));
  return page.items;
}

const inProgress = (r: RecordingView) => !SETTLED_RECORDING_STATES.includes(r.state);

/** Polls while a recording is still on its way to `ready`, so a re-run shows up by itself. */
export function useVisitRecordings(visitId: string) {
  return useSWR<RecordingView[]>(visitRecordingsKey(visitId), () => getVisitRecordings(visitId), {
    refreshInterval: (recordings) => (recordings?.some(inProgress) ? 2000 : 0),
  });
}
