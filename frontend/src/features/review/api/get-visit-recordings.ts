import { SETTLED_RECORDING_STATES } from '@gyre/shared';
import type { Page, RecordingDto } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/recordings?visitId=`: the visit's resting and task recordings, newest first. */
export const visitRecordingsKey = (visitId: string) =>
  withQuery('/api/recordings', { visitId, pageSize: 200, sort: 'createdAt', order: 'desc' });

export async function getVisitRecordings(visitId: string): Promise<RecordingDto[]> {
  const page = await apiFetch<Page<RecordingDto>>(visitRecordingsKey(visitId));
  return page.items;
}

const inProgress = (r: RecordingDto) => !SETTLED_RECORDING_STATES.includes(r.state);

/** Polls while a recording is still on its way to `ready`, so a re-run shows up by itself. */
export function useVisitRecordings(visitId: string) {
  return useSWR<RecordingDto[]>(visitRecordingsKey(visitId), () => getVisitRecordings(visitId), {
    refreshInterval: (recordings) => (recordings?.some(inProgress) ? 2000 : 0),
  });
}
