import type { Page, VisitView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { useRead } from '../../../lib/use-read';

/** `GET /api/visits?participantId=`: one participant's visits, oldest first. */
export function visitsKey(participantId: string): string {
  return withQuery('/api/visits', { participantId, pageSize: 200, sort: 'visitDate' });
}

export function useVisits(participantId: string | null) {
  return useRead<Page<VisitView>>(participantId === null ? null : visitsKey(participantId));
}
