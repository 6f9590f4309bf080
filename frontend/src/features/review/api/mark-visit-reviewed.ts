import type { VisitReviewStateView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { visitReviewKey } from './get-visit-review';

/** `POST /api/visits/:visitId/review`: marks the results the analyst saw (their fingerprint) reviewed. */
export function markVisitReviewed(
  visitId: string,
  fingerprint: string,
): Promise<VisitReviewStateView> {
  return apiSend<VisitReviewStateView>(visitReviewKey(visitId), 'POST', { fingerprint });
}

export function useMarkVisitReviewed(visitId: string) {
  return useWrite(
    (fingerprint: string) => markVisitReviewed(visitId, fingerprint),
    (mutate, state) => mutate(visitReviewKey(visitId), state, { revalidate: false }),
  );
}
