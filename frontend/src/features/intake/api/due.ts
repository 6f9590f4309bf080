import type { DueListView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { useRead } from '../../../lib/use-read';

/** `GET /api/studies/:studyId/due?asOf=`: what is due or overdue at the user's site(s) on a day. */
export const dueKey = (studyId: string, asOf: string) =>
  withQuery(`/api/studies/${encodeURIComponent(studyId)}/due`, { asOf });

/** Keys of every due list of a study (whatever day), to ask again after a new visit. */
export const isDueKey = (studyId: string) => (key: unknown) =>
  typeof key === 'string' && key.startsWith(`/api/studies/${encodeURIComponent(studyId)}/due`);

export function useDue(studyId: string | null, asOf: string) {
  return useRead<DueListView>(studyId === null ? null : dueKey(studyId, asOf));
}
