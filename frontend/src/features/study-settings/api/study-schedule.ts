import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { useMemo } from 'react';
import useSWR, { useSWRConfig, type ScopedMutator } from 'swr';
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

/** Save (`POST` a new item, `PATCH` one by id) and `DELETE` under one list's address. */
function listWrites<Item, Input>(key: string, mutate: ScopedMutator) {
  const itemPath = (id: string) => `${key}/${encodeURIComponent(id)}`;
  return {
    save: async (id: string | null, input: Input) => {
      const saved = await apiSend<Item>(
        id === null ? key : itemPath(id),
        id === null ? 'POST' : 'PATCH',
        input,
      );
      await mutate(key);
      return saved;
    },
    remove: async (id: string) => {
      await apiSend<void>(itemPath(id), 'DELETE');
      await mutate(key);
    },
  };
}

/**
 * Writes of the schedule and the groups (admin): `POST`, `PATCH` and `DELETE` under
 * `/api/studies/:studyId/planned-visits` and `/groups`; each asks for its list again.
 */
export function useScheduleWrites(studyId: string) {
  const { mutate } = useSWRConfig();
  return useMemo(() => {
    const plannedVisits = listWrites<PlannedVisitView, PlannedVisitInput>(
      plannedVisitsKey(studyId),
      mutate,
    );
    const groups = listWrites<StudyGroupView, GroupInput>(groupsKey(studyId), mutate);
    return {
      savePlannedVisit: plannedVisits.save,
      deletePlannedVisit: plannedVisits.remove,
      saveGroup: groups.save,
      deleteGroup: groups.remove,
    };
  }, [mutate, studyId]);
}
