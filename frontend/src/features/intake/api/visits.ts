import type { Page, VisitView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/visits?participantId=`: one participant's visits, oldest first. */
export function visitsKey(participantId: string): string {
  return withQuery('/api/visits', { participantId, pageSize: 200, sort: 'visitDate' });
}

export function getVisits(participantId: string): Promise<Page<VisitView>> {
  return apiFetch<Page<VisitView>>(visitsKey(participantId));
}

export function useVisits(participantId: string | null) {
  return useSWR<Page<VisitView>>(participantId === null ? null : visitsKey(participantId), () =>
    getVisits(participantId ?? ''),
  );
}
