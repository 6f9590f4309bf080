import type { Page, ParticipantView, VisitView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/**
 * `GET /api/participants` and `GET /api/visits`: the codes and labels a report row shows
 * instead of ids. Both are scoped by the server to what the user may read.
 */
export const reportParticipantsKey = withQuery('/api/participants', {
  pageSize: 200,
  sort: 'code',
});
export const reportVisitsKey = withQuery('/api/visits', { pageSize: 200, sort: 'visitDate' });

export function getReportParticipants(): Promise<Page<ParticipantView>> {
  return apiFetch<Page<ParticipantView>>(reportParticipantsKey);
}

export function getReportVisits(): Promise<Page<VisitView>> {
  return apiFetch<Page<VisitView>>(reportVisitsKey);
}

export function useReportContext() {
  const participants = useSWR<Page<ParticipantView>>(reportParticipantsKey, getReportParticipants);
  const visits = useSWR<Page<VisitView>>(reportVisitsKey, getReportVisits);
  return {
    participantCode: (id: string) =>
      participants.data?.items.find((p) => p.id === id)?.code ?? null,
    visit: (id: string) => visits.data?.items.find((v) => v.id === id) ?? null,
  };
}
