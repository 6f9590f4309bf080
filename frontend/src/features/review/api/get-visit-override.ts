import type { VisitAnalysisOverrideView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/analysis-override`: the visit's own choices (revision 0 = none). */
export const visitOverrideKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/analysis-override`;

export function getVisitOverride(visitId: string): Promise<VisitAnalysisOverrideView> {
  return apiFetch<VisitAnalysisOverrideView>(visitOverrideKey(visitId));
}

/** Asks only when `allowed` (the rules let the user read analysis settings). */
export function useVisitOverride(visitId: string, allowed: boolean) {
  return useSWR<VisitAnalysisOverrideView>(allowed ? visitOverrideKey(visitId) : null, () =>
    getVisitOverride(visitId),
  );
}
