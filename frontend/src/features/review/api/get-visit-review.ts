import type { VisitReviewStateView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/review`: whether the current results are reviewed, by whom, when. */
export const visitReviewKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/review`;

export function getVisitReview(visitId: string): Promise<VisitReviewStateView> {
  return apiFetch<VisitReviewStateView>(visitReviewKey(visitId));
}

/** Asks only when the rules let the viewer read reviews (analysts and monitors). */
export function useVisitReview(visitId: string, allowed: boolean) {
  return useSWR<VisitReviewStateView>(allowed ? visitReviewKey(visitId) : null, () =>
    getVisitReview(visitId),
  );
}
