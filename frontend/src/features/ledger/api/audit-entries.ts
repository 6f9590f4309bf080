import type { AuditEntryView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';
import type { AuditFilters } from './audit-filters';

/** `GET /api/audit`: one page of the trail, newest first, filtered in the server's query. */
export function auditEntriesKey(filters: AuditFilters, page: number, pageSize: number): string {
  return withQuery('/api/audit', { ...filters, page, pageSize, sort: 'seq', order: 'desc' });
}

export function useAuditEntries(filters: AuditFilters, page: number, pageSize: number) {
  return usePage<AuditEntryView>(auditEntriesKey(filters, page, pageSize));
}
