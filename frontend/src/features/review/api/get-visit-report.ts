import type { ReportView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetchOrNull } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/report`; a visit without a report answers 404, shown as none. */
export const visitReportKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/report`;

export function getVisitReport(visitId: string): Promise<ReportView | null> {
  return apiFetchOrNull<ReportView>(visitReportKey(visitId));
}

export function useVisitReport(visitId: string) {
  return useSWR<ReportView | null>(visitReportKey(visitId), () => getVisitReport(visitId));
}
