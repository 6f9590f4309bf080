import type { BlindedDecisionChange, VisitBlindingView } from '@gyre/shared';
import useSWR, { type ScopedMutator } from 'swr';
import { apiFetch, apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { getRecordingResults, recordingResultsKey } from './get-recording-results';
import { getVisitFlag, visitFlagKey } from './get-visit-flag';
import { getVisitOverride, visitOverrideKey } from './get-visit-override';
import { getVisitRecordings, visitRecordingsKey } from './get-visit-recordings';
import { getVisitReport, visitReportKey } from './get-visit-report';
import { getVisitReview, visitReviewKey } from './get-visit-review';

/** `GET /api/visits/:visitId/blinding`: whether the visit's details are hidden from the caller. */
export const visitBlindingKey = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/blinding`;

export function useVisitBlinding(visitId: string) {
  return useSWR<VisitBlindingView>(visitBlindingKey(visitId), () =>
    apiFetch<VisitBlindingView>(visitBlindingKey(visitId)),
  );
}

async function fetchUnblinded(visitId: string) {
  const [recordings, report] = await Promise.all([
    getVisitRecordings(visitId),
    getVisitReport(visitId),
  ]);
  const results = await Promise.all(
    recordings.flatMap(({ id, latestRunId }) =>
      latestRunId === null
        ? []
        : [getRecordingResults(id, latestRunId).then((data) => ({ id, latestRunId, data }))],
    ),
  );
  // Colleagues' acts on the visit, also sent by the blinded clock; a read the role may not make
  // (review mark, visit choices) is left to its own hook.
  const [flag, review, override] = await Promise.all([
    getVisitFlag(visitId),
    getVisitReview(visitId).catch(() => undefined),
    getVisitOverride(visitId).catch(() => undefined),
  ]);
  return { recordings, report, results, flag, review, override };
}

/**
 * What Review shows of the visit once it is unblinded for the caller, fetched before the switch:
 * the server sent the blinded recordings, results, report, flag, review mark and visit choices
 * with their times counted from the first upload, and these come back with real ones. All are stored with the new blinding
 * in one synchronous pass, so the page never writes a blinded time as a date.
 */
async function storeUnblinded(mutate: ScopedMutator, visitId: string, view: VisitBlindingView) {
  const refreshed = await fetchUnblinded(visitId).catch(() => null);
  if (refreshed === null) {
    // The decision is recorded all the same: the visit's views are asked again as they are.
    await Promise.all([
      mutate(visitBlindingKey(visitId), view, { revalidate: false }),
      mutate(visitRecordingsKey(visitId)),
      mutate(visitReportKey(visitId)),
      mutate((key) => typeof key === 'string' && key.startsWith('/api/recordings/')),
      mutate(visitFlagKey(visitId)),
      mutate(visitReviewKey(visitId)),
      mutate(visitOverrideKey(visitId)),
    ]);
    return;
  }
  const { recordings, report, results, flag, review, override } = refreshed;
  await Promise.all([
    mutate(visitBlindingKey(visitId), view, { revalidate: false }),
    mutate(visitRecordingsKey(visitId), recordings, { revalidate: false }),
    mutate(visitReportKey(visitId), report, { revalidate: false }),
    ...results.map(({ id, latestRunId, data }) =>
      mutate(recordingResultsKey(id, latestRunId), data, { revalidate: false }),
    ),
    mutate(visitFlagKey(visitId), flag, { revalidate: false }),
    review === undefined
      ? mutate(visitReviewKey(visitId))
      : mutate(visitReviewKey(visitId), review, { revalidate: false }),
    override === undefined
      ? mutate(visitOverrideKey(visitId))
      : mutate(visitOverrideKey(visitId), override, { revalidate: false }),
  ]);
}

/**
 * `POST /api/visits/:visitId/blinding/decision`: the analyst's decision on a blinded visit,
 * which unblinds it for them; the visit's views are asked again (storeUnblinded).
 */
export function useRecordBlindedDecision(visitId: string) {
  return useWrite(
    (change: BlindedDecisionChange) =>
      apiSend<VisitBlindingView>(`${visitBlindingKey(visitId)}/decision`, 'POST', change),
    (mutate, view) => storeUnblinded(mutate, visitId, view),
  );
}
