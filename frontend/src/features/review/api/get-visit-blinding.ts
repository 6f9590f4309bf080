import type { BlindedDecisionChange, VisitBlindingView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { visitFlagKey } from './get-visit-flag';
import { visitReviewKey } from './get-visit-review';

/** `GET /api/visits/:visitId/blinding`: whether the visit's details are hidden from the caller. */
export const visitBlindingKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/blinding`;

export function useVisitBlinding(visitId: string) {
  return useSWR<VisitBlindingView>(visitBlindingKey(visitId), () =>
    apiFetch<VisitBlindingView>(visitBlindingKey(visitId)),
  );
}

/**
 * `POST /api/visits/:visitId/blinding/decision`: the analyst's decision on a blinded visit,
 * which unblinds it for them; the flag and the review state are asked again.
 */
export function useRecordBlindedDecision(visitId: string) {
  return useWrite(
    (change: BlindedDecisionChange) =>
      apiSend<VisitBlindingView>(`${visitBlindingKey(visitId)}/decision`, 'POST', change),
    (mutate, view) =>
      Promise.all([
        mutate(visitBlindingKey(visitId), view, { revalidate: false }),
        mutate(visitFlagKey(visitId)),
        mutate(visitReviewKey(visitId)),
      ]),
  );
}
