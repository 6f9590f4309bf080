import type { Page, ReportView, ReportState } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/reports`: the reports in the user's scope (a coordinator: signed ones of their site). */
export function reportsKey(state: ReportState | null, page: number, pageSize: number): string {
  return withQuery('/api/reports', { state, page, pageSize, sort: 'updatedAt', order: 'desc' });
}

export function getReports(key: string): Promise<Page<ReportView>> {
  return apiFetch<Page<ReportView>>(key);
}

export function useReports(state: ReportState | null, page: number, pageSize: number) {
  return useSWR<Page<ReportView>>(reportsKey(state, page, pageSize), getReports, {
    keepPreviousData: true,
  });
}
