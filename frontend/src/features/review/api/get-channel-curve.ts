import type { OnsetCurveView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/recordings/:recordingId/results/curves?runId=&channel=`: one channel's onset curve. */
export const channelCurveKey = (recordingId: string, runId: string, channel: string) =>
  withQuery(`/api/recordings/${encodeURIComponent(recordingId)}/results/curves`, {
    runId,
    channel,
  });

export function getChannelCurve(
  recordingId: string,
  runId: string,
  channel: string,
): Promise<OnsetCurveView> {
  return apiFetch<OnsetCurveView>(channelCurveKey(recordingId, runId, channel));
}

/** Asked when the analyst picks the channel (`null` asks nothing); a run never changes. */
export function useChannelCurve(recordingId: string, runId: string, channel: string | null) {
  return useSWR<OnsetCurveView>(
    channel === null ? null : channelCurveKey(recordingId, runId, channel),
    () => getChannelCurve(recordingId, runId, channel ?? ''),
    { revalidateIfStale: false },
  );
}
