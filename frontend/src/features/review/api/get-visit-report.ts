import type { ReportView } from '@gyre/shared';
import useSWR from 'swr';
import { ApiError, apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/report`; a visit without a report answers 404, shown as none. */
export const visitReportKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/report`;

export async function getVisitReport(visitId: string): Promise<ReportView | null> {
  try {
    return await apiFetch<ReportView>(visitReportKey(visitId));
  } catch (error) {
    if (error instanceof ApiError && error.status === 404) return null;
    throw error;
  }
}

export function useVisitReport(visitId: string) {
  return useSWR<ReportView | null>(visitReportKey(visitId), () => getVisitReport(visitId));
}
