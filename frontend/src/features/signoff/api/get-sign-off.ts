import type { ReportSignOffView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetchOrNull } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/report/sign-off`: draft fingerprint, pending revision, revisions. */
export const signOffKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/report/sign-off`;

/** A visit without a report yet answers 404: shown as "nothing to sign". */
export function getSignOff(visitId: string): Promise<ReportSignOffView | null> {
  return apiFetchOrNull<ReportSignOffView>(signOffKey(visitId));
}

export function useSignOff(visitId: string) {
  return useSWR<ReportSignOffView | null>(signOffKey(visitId), () => getSignOff(visitId));
}
