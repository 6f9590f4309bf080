import type { VisitView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitsKey } from './visits';

export interface CreateVisitBody {
  participantId: string;
  label: string;
  /** `YYYY-MM-DD`. */
  visitDate: string;
}

/** `POST /api/visits`: registers a visit of a participant. */
export function createVisit(body: CreateVisitBody): Promise<VisitView> {
  return apiSend<VisitView>('/api/visits', 'POST', body);
}

export function useCreateVisit() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (body: CreateVisitBody) => {
      const created = await createVisit(body);
      await mutate(visitsKey(body.participantId));
      return created;
    },
    [mutate],
  );
}
