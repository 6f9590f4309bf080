import type { VisitView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId`. */
export const visitKey = (visitId: string) => `/api/visits/${encodeURIComponent(visitId)}`;

export function getVisit(visitId: string): Promise<VisitView> {
  return apiFetch<VisitView>(visitKey(visitId));
}

export function useVisit(visitId: string) {
  return useSWR<VisitView>(visitKey(visitId), () => getVisit(visitId));
}
