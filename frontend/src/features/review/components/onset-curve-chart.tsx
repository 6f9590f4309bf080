import type { OnsetCurveDto, TaskResultsDto } from '@gyre/shared';
import { Flex, Select, Skeleton, Typography } from 'antd';
import { useMemo, useState } from 'react';
import { PlotFigure } from '../../../components/charts/plot-figure';
import { ErrorState } from '../../../components/page-states';
import { formatHz } from '../../../lib/format';
import { NO_ROI_CHANNEL_REMAINS } from '../../../lib/roi-usage';
import { useChannelCurve } from '../api/get-channel-curve';
import {
  BASELINE_COLOUR,
  MEAN_COLOUR,
  onsetCurvePoints,
  onsetCurveSpec,
  POST_COLOUR,
  type OnsetCurvePoint,
} from './onset-curve-spec';

const ROI = '__roi__';

function windowText([start, end]: [number, number]): string {
  const signed = (v: number) => (v > 0 ? `+${v.toFixed(1)}` : v.toFixed(1));
  return `${signed(start)} to ${signed(end)} s`;
}

function Swatch({
  colour,
  opacity = 1,
  line = false,
}: {
  colour: string;
  opacity?: number;
  line?: boolean;
}) {
  return (
    <span
      aria-hidden="true"
      style={{
        display: 'inline-block',
        width: 18,
        height: line ? 3 : 12,
        background: colour,
        opacity,
        borderRadius: 2,
        verticalAlign: 'middle',
        marginRight: 6,
      }}
    />
  );
}

const NO_POINTS: OnsetCurvePoint[] = [];

/**
 * The onset curve of the region of interest, or of one channel the analyst picks: the
 * results carry the region's curve, and a channel's is asked for when it is picked.
 */
export function OnsetCurveChart({
  recordingId,
  runId,
  task,
  roiLabel,
  roiAvailable = true,
}: {
  recordingId: string;
  runId: string;
  task: TaskResultsDto;
  roiLabel: string;
  /** False when no region-of-interest channel remains: the channels' curves only. */
  roiAvailable?: boolean;
}) {
  const [series, setSeries] = useState<string>(roiAvailable ? ROI : (task.curveChannels[0] ?? ROI));
  const picked = series === ROI ? null : series;
  const channelCurve = useChannelCurve(recordingId, runId, picked);
  const curve: OnsetCurveDto | undefined = picked === null ? task.roi : channelCurve.data;
  const seriesName = picked === null ? `Mean, ${roiLabel}` : `Mean, ${picked}`;
  const points = useMemo(
    () => (curve === undefined ? NO_POINTS : onsetCurvePoints(task.timeS, curve)),
    [task.timeS, curve],
  );
  const spec = useMemo(
    () =>
      onsetCurveSpec({
        points,
        baselineWindowS: task.baselineWindowS,
        postWindowS: task.postWindowS,
        seriesName,
      }),
    [points, task.baselineWindowS, task.postWindowS, seriesName],
  );
  const meanOf = (window: [number, number]) => {
    const inside = points.filter((p) => p.timeS >= window[0] && p.timeS <= window[1]);
    return inside.length === 0 ? null : inside.reduce((s, p) => s + p.meanHz, 0) / inside.length;
  };
  return (
    <div>
      <Flex justify="space-between" align="center" wrap gap={12} style={{ marginBottom: 8 }}>
        <Flex gap={16} wrap style={{ fontSize: 13 }}>
          <span>
            <Swatch colour={MEAN_COLOUR} line />
            {seriesName}
          </span>
          <span>
            <Swatch colour={MEAN_COLOUR} opacity={0.25} />
            95 % confidence band
          </span>
          <span>
            <Swatch colour={BASELINE_COLOUR} opacity={0.3} />
            Baseline {windowText(task.baselineWindowS)}
          </span>
          <span>
            <Swatch colour={POST_COLOUR} opacity={0.3} />
            Post {windowText(task.postWindowS)}
          </span>
        </Flex>
        <Select
          aria-label="Curve shown"
          value={series}
          onChange={setSeries}
          style={{ minWidth: 200 }}
          options={[
            roiAvailable
              ? { value: ROI, label: `Region of interest (${roiLabel})` }
              : {
                  value: ROI,
                  label: `Region of interest: ${NO_ROI_CHANNEL_REMAINS}`,
                  disabled: true,
                },
            ...task.curveChannels.map((name) => ({ value: name, label: name })),
          ]}
        />
      </Flex>
      {picked !== null && channelCurve.error !== undefined ? (
        <ErrorState
          title={`The curve of ${picked} could not be loaded`}
          error={channelCurve.error}
          onRetry={() => void channelCurve.mutate()}
        />
      ) : curve === undefined ? (
        <div aria-busy="true" aria-label={`Loading the curve of ${picked ?? roiLabel}`}>
          <Skeleton active paragraph={{ rows: 5 }} />
        </div>
      ) : points.length === 0 ? (
        <Typography.Text type="secondary">
          No curve: no trial was kept for this series.
        </Typography.Text>
      ) : (
        <PlotFigure
          label="Onset curve"
          spec={spec}
          heightPx={300}
          caption={
            <>
              Mean instantaneous frequency from {points[0].timeS.toFixed(1)} s to{' '}
              {points[points.length - 1].timeS.toFixed(1)} s around stimulus onset. Baseline mean{' '}
              <span className="gyre-figures">{formatHz(meanOf(task.baselineWindowS))}</span>, post
              mean <span className="gyre-figures">{formatHz(meanOf(task.postWindowS))}</span> (curve
              averages; the table's Δf is averaged over trials).
            </>
          }
        />
      )}
    </div>
  );
}
