import type { Page, ParticipantListItem } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

export const PARTICIPANT_SORTS = ['code', 'createdAt'] as const;
export type ParticipantSort = (typeof PARTICIPANT_SORTS)[number];

export interface ParticipantQuery {
  page: number;
  pageSize: number;
  sort: ParticipantSort;
  order: 'asc' | 'desc';
  /** Part of a participant code; empty for all. */
  search: string;
  /** One site, or null for every site in scope. */
  siteId: string | null;
}

/** `GET /api/participants`: search, sort and paging are done by the server. */
export const participantsKey = (query: ParticipantQuery) =>
  withQuery('/api/participants', {
    page: query.page,
    pageSize: query.pageSize,
    sort: query.sort,
    order: query.order,
    q: query.search.trim(),
    siteId: query.siteId,
  });

/** Each row carries its site and group names, visits, latest values, flags and report. */
export function getParticipants(query: ParticipantQuery): Promise<Page<ParticipantListItem>> {
  return apiFetch<Page<ParticipantListItem>>(participantsKey(query));
}

/** Keeps the last page on screen while the next one loads, so the table does not jump. */
export function useParticipants(query: ParticipantQuery) {
  return useSWR<Page<ParticipantListItem>>(participantsKey(query), () => getParticipants(query), {
    keepPreviousData: true,
  });
}
