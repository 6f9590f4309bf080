import type { OnsetCurveView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { useRead } from '../../../lib/use-read';

/** `GET /api/recordings/:recordingId/results/curves?runId=&channel=`: one channel's onset curve. */
export const channelCurveKey = (recordingId: string, runId: string, channel: string) =>
  withQuery(`/api/recordings/${encodeURIComponent(recordingId)}/results/curves`, {
    runId,
    channel,
  });

/** Asked when the analyst picks the channel (`null` asks nothing); a run never changes. */
export function useChannelCurve(recordingId: string, runId: string, channel: string | null) {
  return useRead<OnsetCurveView>(
    channel === null ? null : channelCurveKey(recordingId, runId, channel),
    { revalidateIfStale: false },
  );
}
