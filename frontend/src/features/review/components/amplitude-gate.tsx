import type { ChannelStatsView } from '@gyre/shared';
import { Typography } from 'antd';
import type { TableColumnsType } from 'antd';
import { numberColumn } from '../../../components/number-column';
import { formatNumber, formatShareAsPercent } from '../../../lib/format';

/** The gate's percentile when any channel was gated; null when the gate was off. */
export function gatePercentileOf(channels: ChannelStatsView[]): number | null {
  for (const channel of channels) {
    const percentile = channel.amplitudeGate?.percentile;
    if (percentile !== null && percentile !== undefined) return percentile;
  }
  return null;
}

/** Share of a channel's samples the gate left out; null without a gate or samples. */
export function gatedShareOf(channel: ChannelStatsView): number | null {
  const gate = channel.amplitudeGate;
  if (gate === null || gate.percentile === null || gate.totalSamples === 0) return null;
  return gate.excludedSamples / gate.totalSamples;
}

/** The per-channel column of samples the gate left out. */
export function amplitudeGateColumn(): TableColumnsType<ChannelStatsView>[number] {
  return numberColumn('Left out by the gate', 'amplitudeGate', gatedShareOf, (row) =>
    formatShareAsPercent(gatedShareOf(row)),
  );
}

/** Above the per-channel table: which samples the amplitude gate left out. */
export function AmplitudeGateNote({ percentile }: { percentile: number }) {
  return (
    <Typography.Paragraph
      data-testid="amplitude-gate-note"
      className="gyre-review-small gyre-figures"
    >
      Amplitude gate on: instantaneous-frequency samples under percentile{' '}
      {formatNumber(percentile, 0)} of each channel's alpha envelope were left out before the median
      and the epoch means. The last column gives each channel's share left out.
    </Typography.Paragraph>
  );
}
