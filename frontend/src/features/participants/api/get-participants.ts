import type { ParticipantListItem } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';

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
export function useParticipants(query: ParticipantQuery) {
  return usePage<ParticipantListItem>(participantsKey(query));
}
