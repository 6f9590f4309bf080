import type { VisitFlagDto } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/flag`: the analyst's decision, the computation's suggestion, history. */
export const visitFlagKey = (visitId: string) => `/api/visits/${encodeURIComponent(visitId)}/flag`;

export function getVisitFlag(visitId: string): Promise<VisitFlagDto> {
  return apiFetch<VisitFlagDto>(visitFlagKey(visitId));
}

export function useVisitFlag(visitId: string) {
  return useSWR<VisitFlagDto>(visitFlagKey(visitId), () => getVisitFlag(visitId));
}
