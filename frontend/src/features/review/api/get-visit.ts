import type { VisitView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId`. */
export const visitKey = (visitId: string) => `/api/visits/${encodeURIComponent(visitId)}`;

export function getVisit(visitId: string): Promise<VisitView> {
  return apiFetch<VisitView>(visitKey(visitId));
}

/** `enabled` false: not asked (a visit blinded for the caller, or not known yet). */
export function useVisit(visitId: string, enabled = true) {
  return useSWR<VisitView>(enabled ? visitKey(visitId) : null, () => getVisit(visitId));
}
