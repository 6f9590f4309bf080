import type { Page, VisitView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/visits?participantId=`: every visit of one participant, by date. */
export const participantVisitsKey = (participantId: string) =>
  withQuery('/api/visits', { participantId, pageSize: 200, sort: 'visitDate', order: 'asc' });

export async function getParticipantVisits(participantId: string): Promise<VisitView[]> {
  const page = await apiFetch<Page<VisitView>>(participantVisitsKey(participantId));
  return page.items;
}

export function useParticipantVisits(participantId: string) {
  return useSWR<VisitView[]>(participantVisitsKey(participantId), () =>
    getParticipantVisits(participantId),
  );
}
