import type { JobDto } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitRecordingsKey } from './get-visit-recordings';

/** `POST /api/visits/:visitId/runs`: queues every ready or failed recording of the visit again. */
export function rerunVisit(visitId: string, reason: string | null): Promise<JobDto[]> {
  return apiSend<JobDto[]>(
    `/api/visits/${encodeURIComponent(visitId)}/runs`,
    'POST',
    reason === null ? {} : { reason },
  );
}

export function useRerunVisit() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (visitId: string, reason: string | null) => {
      const jobs = await rerunVisit(visitId, reason);
      await mutate(visitRecordingsKey(visitId));
      return jobs;
    },
    [mutate],
  );
}
