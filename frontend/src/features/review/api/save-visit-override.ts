import type { VisitAnalysisOverrideChange, VisitAnalysisOverrideView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { visitRecordingsKey } from './get-visit-recordings';
import { visitOverrideKey } from './get-visit-override';

/** The answer when the choices equal the visit's current ones (409). */
export const ANALYSIS_OVERRIDE_UNCHANGED = 'ANALYSIS_OVERRIDE_UNCHANGED';

/**
 * `PUT /api/visits/:visitId/analysis-override`: a new revision of the visit's own choices
 * (audited, with a reason); the server then computes the visit's recordings again.
 */
export function saveVisitOverride(
  visitId: string,
  change: VisitAnalysisOverrideChange,
): Promise<VisitAnalysisOverrideView> {
  return apiSend<VisitAnalysisOverrideView>(visitOverrideKey(visitId), 'PUT', change);
}

export function useSaveVisitOverride(visitId: string) {
  return useWrite(
    (change: VisitAnalysisOverrideChange) => saveVisitOverride(visitId, change),
    async (mutate, saved) => {
      await mutate(visitOverrideKey(visitId), saved, { revalidate: false });
      // The re-run shows up in the recordings' states.
      await mutate(visitRecordingsKey(visitId));
    },
  );
}
