import type { StudyGroupView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/studies/:studyId/groups`: the study's groups (arms), for names and the edit form. */
export const groupsKey = (studyId: string) => `/api/studies/${encodeURIComponent(studyId)}/groups`;

export function useGroups(studyId: string | null) {
  return useSWR<StudyGroupView[]>(studyId === null ? null : groupsKey(studyId), () =>
    apiFetch<StudyGroupView[]>(groupsKey(studyId ?? '')),
  );
}
