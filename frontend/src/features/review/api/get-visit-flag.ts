import type { VisitFlagView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/flag`: the analyst's decision, the computation's suggestion, history. */
export const visitFlagKey = (visitId: string) => `/api/visits/${encodeURIComponent(visitId)}/flag`;

export function getVisitFlag(visitId: string): Promise<VisitFlagView> {
  return apiFetch<VisitFlagView>(visitFlagKey(visitId));
}

export function useVisitFlag(visitId: string) {
  return useSWR<VisitFlagView>(visitFlagKey(visitId), () => getVisitFlag(visitId));
}
