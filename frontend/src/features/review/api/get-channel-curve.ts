import type { OnsetCurveDto } from '@gyre/shared';
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
): Promise<OnsetCurveDto> {
  return apiFetch<OnsetCurveDto>(channelCurveKey(recordingId, runId, channel));
}

/** Asked when the analyst picks the channel (`null` asks nothing); a run never changes. */
export function useChannelCurve(recordingId: string, runId: string, channel: string | null) {
  return useSWR<OnsetCurveDto>(
    channel === null ? null : channelCurveKey(recordingId, runId, channel),
    () => getChannelCurve(recordingId, runId, channel ?? ''),
    { revalidateIfStale: false },
  );
}
