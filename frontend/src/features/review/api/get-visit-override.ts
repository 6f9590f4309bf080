import type { VisitAnalysisOverrideDto } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/analysis-override`: the visit's own choices (revision 0 = none). */
export const visitOverrideKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/analysis-override`;

export function getVisitOverride(visitId: string): Promise<VisitAnalysisOverrideDto> {
  return apiFetch<VisitAnalysisOverrideDto>(visitOverrideKey(visitId));
}

/** Asks only when `allowed` (the rules let the user read analysis settings). */
export function useVisitOverride(visitId: string, allowed: boolean) {
  return useSWR<VisitAnalysisOverrideDto>(allowed ? visitOverrideKey(visitId) : null, () =>
    getVisitOverride(visitId),
  );
}
