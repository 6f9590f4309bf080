import type { ReportView, ReportState } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';

/** `GET /api/reports`: the reports in the user's scope (a coordinator: signed ones of their site). */
export function reportsKey(state: ReportState | null, page: number, pageSize: number): string {
  return withQuery('/api/reports', { state, page, pageSize, sort: 'updatedAt', order: 'desc' });
}

export function useReports(state: ReportState | null, page: number, pageSize: number) {
  return usePage<ReportView>(reportsKey(state, page, pageSize));
}
