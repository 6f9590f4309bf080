import type { Page, ReportDto, ReportState } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/reports`: the reports in the user's scope (a coordinator: signed ones of their site). */
export function reportsKey(state: ReportState | null, page: number, pageSize: number): string {
  return withQuery('/api/reports', { state, page, pageSize, sort: 'updatedAt', order: 'desc' });
}

export function getReports(key: string): Promise<Page<ReportDto>> {
  return apiFetch<Page<ReportDto>>(key);
}

export function useReports(state: ReportState | null, page: number, pageSize: number) {
  return useSWR<Page<ReportDto>>(reportsKey(state, page, pageSize), getReports, {
    keepPreviousData: true,
  });
}
