import type { AuditEntryView, Page } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';
import type { AuditFilters } from './audit-filters';

/** `GET /api/audit`: one page of the trail, newest first, filtered in the server's query. */
export function auditEntriesKey(filters: AuditFilters, page: number, pageSize: number): string {
  return withQuery('/api/audit', { ...filters, page, pageSize, sort: 'seq', order: 'desc' });
}

export function getAuditEntries(key: string): Promise<Page<AuditEntryView>> {
  return apiFetch<Page<AuditEntryView>>(key);
}

export function useAuditEntries(filters: AuditFilters, page: number, pageSize: number) {
  return useSWR<Page<AuditEntryView>>(auditEntriesKey(filters, page, pageSize), getAuditEntries, {
    keepPreviousData: true,
  });
}
