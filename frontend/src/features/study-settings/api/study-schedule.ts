import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { useMemo } from 'react';
import { useSWRConfig, type ScopedMutator } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { groupsKey, plannedVisitsKey } from '../../../lib/study-schedule';

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
