import type { VisitReviewStateDto } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitReviewKey } from './get-visit-review';

/** `POST /api/visits/:visitId/review`: marks the results the analyst saw (their fingerprint) reviewed. */
export function markVisitReviewed(
  visitId: string,
  fingerprint: string,
): Promise<VisitReviewStateDto> {
  return apiSend<VisitReviewStateDto>(visitReviewKey(visitId), 'POST', { fingerprint });
}

export function useMarkVisitReviewed(visitId: string) {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (fingerprint: string) => {
      const state = await markVisitReviewed(visitId, fingerprint);
      await mutate(visitReviewKey(visitId), state, { revalidate: false });
      return state;
    },
    [mutate, visitId],
  );
}
