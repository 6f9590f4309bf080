import type { JobDto } from '@gyre/shared';
import { mutate } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitRecordingsKey } from './get-visit-recordings';

/** `POST /api/visits/:visitId/runs`: queues every ready or failed recording of the visit again. */
export async function rerunVisit(visitId: string, reason: string | null): Promise<JobDto[]> {
  const jobs = await apiSend<JobDto[]>(
    `/api/visits/${encodeURIComponent(visitId)}/runs`,
    'POST',
    reason === null ? {} : { reason },
  );
  await mutate(visitRecordingsKey(visitId));
  return jobs;
}
