import type { OnsetCurveView, TaskResultsView } from '@gyre/shared';
import { Flex, Select, Skeleton, Switch, Typography } from 'antd';
import { useCallback, useMemo, useState } from 'react';
import { PlotFigure } from '../../../components/charts/plot-figure';
import { ReadError } from '../../../components/page-states';
import { formatHz, formatQuantity, formatQuantityRange } from '../../../lib/format';
import { NO_ROI_CHANNEL_REMAINS } from '../../../lib/roi-usage';
import { useChannelCurve } from '../api/get-channel-curve';
import { conditionOverlaysOf } from './conditions-overlay';
import {
  BASELINE_COLOUR,
  MEAN_COLOUR,
  onsetCurvePoints,
  onsetCurveSpec,
  POST_COLOUR,
  type OnsetCurvePoint,
} from './onset-curve-spec';

const ROI = '__roi__';

/** A window relative to onset, signed: `−0.5 to 0.0 s`, `+0.2 to +0.8 s`. */
function windowText(window: [number, number]): string {
  return formatQuantityRange(window, 'timeFromOnsetS');
}

const CHART_HEIGHT_PX = 300;

function Swatch({
  colour,
  opacity = 1,
  line = false,
  dashed = false,
}: {
  colour: string;
  opacity?: number;
  line?: boolean;
  dashed?: boolean;
}) {
  return (
    <span
      aria-hidden="true"
      className="gyre-legend-swatch"
      style={{
        height: line ? 3 : 12,
        background: dashed
          ? `repeating-linear-gradient(90deg, ${colour} 0 6px, transparent 6px 9px)`
          : colour,
        opacity,
        borderRadius: 2,
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
  task: TaskResultsView;
  roiLabel: string;
  /** False when no region-of-interest channel remains: the channels' curves only. */
  roiAvailable?: boolean;
}) {
  const [series, setSeries] = useState<string>(roiAvailable ? ROI : (task.curveChannels[0] ?? ROI));
  const picked = series === ROI ? null : series;
  const channelCurve = useChannelCurve(recordingId, runId, picked);
  const curve: OnsetCurveView | undefined = picked === null ? task.roi : channelCurve.data;
  const seriesName = picked === null ? `Mean, ${roiLabel}` : `Mean, ${picked}`;
  const points = useMemo(
    () => (curve === undefined ? NO_POINTS : onsetCurvePoints(task.timeS, curve)),
    [task.timeS, curve],
  );
  const [conditionsShown, setConditionsShown] = useState(false);
  // The conditions' curves are the region of interest's: drawn over its curve only.
  const overlays = useMemo(
    () => (conditionsShown && picked === null ? conditionOverlaysOf(task) : []),
    [conditionsShown, picked, task],
  );
  const spec = useCallback(
    (widthPx: number) =>
      onsetCurveSpec({
        points,
        baselineWindowS: task.baselineWindowS,
        postWindowS: task.postWindowS,
        seriesName,
        widthPx,
        heightPx: CHART_HEIGHT_PX,
        overlays,
      }),
    [points, task.baselineWindowS, task.postWindowS, seriesName, overlays],
  );
  const meanOf = (window: [number, number]) => {
    const inside = points.filter((p) => p.timeS >= window[0] && p.timeS <= window[1]);
    return inside.length === 0 ? null : inside.reduce((s, p) => s + p.meanHz, 0) / inside.length;
  };
  return (
    <div>
      <Flex justify="space-between" align="center" wrap gap={12} className="gyre-below-xs">
        {/* The chart's key: the windows are named here, not inside the plot, where their
            labels would collide on a narrow screen. */}
        <Flex gap={16} wrap className="gyre-review-small gyre-figures">
          <span data-gyre-key="mean">
            <Swatch colour={MEAN_COLOUR} line />
            {seriesName}
          </span>
          <span data-gyre-key="band">
            <Swatch colour={MEAN_COLOUR} opacity={0.25} />
            95 % confidence band
          </span>
          <span data-gyre-key="baseline" className="gyre-nowrap">
            <Swatch colour={BASELINE_COLOUR} opacity={0.3} />
            Baseline {windowText(task.baselineWindowS)}
          </span>
          <span data-gyre-key="post" className="gyre-nowrap">
            <Swatch colour={POST_COLOUR} opacity={0.3} />
            Post {windowText(task.postWindowS)}
          </span>
          {overlays.map((overlay) => (
            <span key={overlay.name} data-gyre-key="condition">
              <Swatch colour={overlay.colour} line dashed={overlay.dashed} />
              {overlay.name}
            </span>
          ))}
        </Flex>
        {task.conditionCurves.length > 0 && picked === null && (
          <label className="gyre-review-small">
            <Switch
              size="small"
              checked={conditionsShown}
              onChange={setConditionsShown}
              aria-label="Show the conditions' curves"
              style={{ marginRight: 6 }}
            />
            Conditions
          </label>
        )}
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
        <ReadError read={channelCurve} title={`The curve of ${picked} could not be loaded`} />
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
          heightPx={CHART_HEIGHT_PX}
          caption={
            <>
              Mean instantaneous frequency from {formatQuantity(points[0].timeS, 'timeFromOnsetS')}{' '}
              to {formatQuantity(points[points.length - 1].timeS, 'timeFromOnsetS')} around stimulus
              onset. Baseline mean{' '}
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
