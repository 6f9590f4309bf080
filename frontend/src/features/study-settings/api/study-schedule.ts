import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { useCallback } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import { apiFetch, apiSend } from '../../../lib/api-client';

const studyPath = (studyId: string) => `/api/studies/${encodeURIComponent(studyId)}`;

/** `GET /api/studies/:studyId/planned-visits`: the visit schedule, in order. */
export const plannedVisitsKey = (studyId: string) => `${studyPath(studyId)}/planned-visits`;

export function usePlannedVisits(studyId: string | null) {
  return useSWR<PlannedVisitView[]>(studyId === null ? null : plannedVisitsKey(studyId), () =>
    apiFetch<PlannedVisitView[]>(plannedVisitsKey(studyId ?? '')),
  );
}

/** `GET /api/studies/:studyId/groups`: the study's groups (arms), by name. */
export const groupsKey = (studyId: string) => `${studyPath(studyId)}/groups`;

export function useGroups(studyId: string | null) {
  return useSWR<StudyGroupView[]>(studyId === null ? null : groupsKey(studyId), () =>
    apiFetch<StudyGroupView[]>(groupsKey(studyId ?? '')),
  );
}

export interface PlannedVisitInput {
  name: string;
  targetDay: number;
  windowBeforeDays: number;
  windowAfterDays: number;
  position?: number;
}

export interface GroupInput {
  name: string;
  description: string;
}

/**
 * Writes of the schedule and the groups (admin): `POST`, `PATCH` and `DELETE` under
 * `/api/studies/:studyId/planned-visits` and `/groups`; each asks for its list again.
 */
export function useScheduleWrites(studyId: string) {
  const { mutate } = useSWRConfig();
  return {
    savePlannedVisit: useCallback(
      async (id: string | null, input: PlannedVisitInput) => {
        const key = plannedVisitsKey(studyId);
        const saved = await apiSend<PlannedVisitView>(
          id === null ? key : `${key}/${encodeURIComponent(id)}`,
          id === null ? 'POST' : 'PATCH',
          input,
        );
        await mutate(key);
        return saved;
      },
      [mutate, studyId],
    ),
    deletePlannedVisit: useCallback(
      async (id: string) => {
        const key = plannedVisitsKey(studyId);
        await apiSend<void>(`${key}/${encodeURIComponent(id)}`, 'DELETE');
        await mutate(key);
      },
      [mutate, studyId],
    ),
    saveGroup: useCallback(
      async (id: string | null, input: GroupInput) => {
        const key = groupsKey(studyId);
        const saved = await apiSend<StudyGroupView>(
          id === null ? key : `${key}/${encodeURIComponent(id)}`,
          id === null ? 'POST' : 'PATCH',
          input,
        );
        await mutate(key);
        return saved;
      },
      [mutate, studyId],
    ),
    deleteGroup: useCallback(
      async (id: string) => {
        const key = groupsKey(studyId);
        await apiSend<void>(`${key}/${encodeURIComponent(id)}`, 'DELETE');
        await mutate(key);
      },
      [mutate, studyId],
    ),
  };
}
