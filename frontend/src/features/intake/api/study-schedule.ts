import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/studies/:studyId/planned-visits`: the study's visit schedule, in order. */
export const plannedVisitsKey = (studyId: string) =>
  `/api/studies/${encodeURIComponent(studyId)}/planned-visits`;

export function usePlannedVisits(studyId: string | null) {
  return useSWR<PlannedVisitView[]>(studyId === null ? null : plannedVisitsKey(studyId), () =>
    apiFetch<PlannedVisitView[]>(plannedVisitsKey(studyId ?? '')),
  );
}

/** `GET /api/studies/:studyId/groups`: the study's groups (arms). */
export const groupsKey = (studyId: string) => `/api/studies/${encodeURIComponent(studyId)}/groups`;

export function useGroups(studyId: string | null) {
  return useSWR<StudyGroupView[]>(studyId === null ? null : groupsKey(studyId), () =>
    apiFetch<StudyGroupView[]>(groupsKey(studyId ?? '')),
  );
}
