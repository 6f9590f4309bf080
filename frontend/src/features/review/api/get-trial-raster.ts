import type { TrialRasterView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { useRead } from '../../../lib/use-read';

/** `GET /api/recordings/:recordingId/results/raster?runId=`: one run's trial raster. */
export const trialRasterKey = (recordingId: string, runId: string) =>
  withQuery(`/api/recordings/${encodeURIComponent(recordingId)}/results/raster`, { runId });

/** Asked only while the raster chart is on screen (`null` ids ask nothing); a run never changes. */
export function useTrialRaster(recordingId: string | null, runId: string | null) {
  return useRead<TrialRasterView>(
    recordingId === null || runId === null ? null : trialRasterKey(recordingId, runId),
    { revalidateIfStale: false },
  );
}
