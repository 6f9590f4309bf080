import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { useRead } from './use-read';

/** The address of a study's own resources. */
export const studyPath = (studyId: string) => `/api/studies/${encodeURIComponent(studyId)}`;

/** `GET /api/studies/:studyId/planned-visits`: the study's visit schedule, in order. */
export const plannedVisitsKey = (studyId: string) => `${studyPath(studyId)}/planned-visits`;

export function usePlannedVisits(studyId: string | null) {
  return useRead<PlannedVisitView[]>(studyId === null ? null : plannedVisitsKey(studyId));
}

/** `GET /api/studies/:studyId/groups`: the study's groups (arms), by name. */
export const groupsKey = (studyId: string) => `${studyPath(studyId)}/groups`;

export function useGroups(studyId: string | null) {
  return useRead<StudyGroupView[]>(studyId === null ? null : groupsKey(studyId));
}
