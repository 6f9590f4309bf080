import type { TrialRasterView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/recordings/:recordingId/results/raster?runId=`: one run's trial raster. */
export const trialRasterKey = (recordingId: string, runId: string) =>
  withQuery(`/api/recordings/${encodeURIComponent(recordingId)}/results/raster`, { runId });

export function getTrialRaster(recordingId: string, runId: string): Promise<TrialRasterView> {
  return apiFetch<TrialRasterView>(trialRasterKey(recordingId, runId));
}

/** Asked only while the raster chart is on screen (`null` ids ask nothing); a run never changes. */
export function useTrialRaster(recordingId: string | null, runId: string | null) {
  return useSWR<TrialRasterView>(
    recordingId === null || runId === null ? null : trialRasterKey(recordingId, runId),
    () => getTrialRaster(recordingId ?? '', runId ?? ''),
    { revalidateIfStale: false },
  );
}
