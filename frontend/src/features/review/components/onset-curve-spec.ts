import type { OnsetCurveDto } from '@gyre/shared';
import { CHART_PALETTE, GYRE_COLORS } from '../../../app/theme';
import { axisWithUnit, gyreView, type PlotSpec } from '../../../components/charts/plot-spec';

export interface OnsetCurvePoint {
  timeS: number;
  meanHz: number;
  ciLowHz: number | null;
  ciHighHz: number | null;
}

/** Pairs the curve with its time axis, leaving out points where the mean is undefined. */
export function onsetCurvePoints(timeS: number[], curve: OnsetCurveDto): OnsetCurvePoint[] {
  const points: OnsetCurvePoint[] = [];
  timeS.forEach((t, i) => {
    const mean = curve.meanHz[i];
    if (mean === null || mean === undefined || !Number.isFinite(mean)) return;
    points.push({
      timeS: t,
      meanHz: mean,
      ciLowHz: curve.ciLowHz[i] ?? null,
      ciHighHz: curve.ciHighHz[i] ?? null,
    });
  });
  return points;
}

export const BASELINE_COLOUR = CHART_PALETTE[2];
export const POST_COLOUR = CHART_PALETTE[4];
export const MEAN_COLOUR = CHART_PALETTE[0];

const hz = (value: number) => `${value.toFixed(2)} Hz`;

/**
 * Mean instantaneous frequency around onset with its 95 % CI band, the baseline and post
 * windows shaded behind it and a dashed line at onset (0 s).
 */
export function onsetCurveSpec(options: {
  points: OnsetCurvePoint[];
  baselineWindowS: [number, number];
  postWindowS: [number, number];
  seriesName: string;
}): PlotSpec {
  const { points, baselineWindowS, postWindowS, seriesName } = options;
  const band = points.filter((p) => p.ciLowHz !== null && p.ciHighHz !== null);
  const first = points[0]?.timeS ?? -1;
  const last = points[points.length - 1]?.timeS ?? 2;
  return gyreView({
    padding: 'auto',
    scale: {
      x: { type: 'linear', domain: [first, last], nice: false },
      y: { nice: true, zero: false },
    },
    axis: {
      x: axisWithUnit('Time from onset', 's', { labelFormatter: (v) => v.toFixed(1) }),
      y: axisWithUnit('Mean instantaneous frequency', 'Hz', {
        labelFormatter: (v) => v.toFixed(1),
      }),
    },
    legend: false,
    interaction: { tooltip: { shared: true } },
    children: [
      {
        type: 'rangeX',
        data: [
          { start: baselineWindowS[0], end: baselineWindowS[1], window: 'Baseline' },
          { start: postWindowS[0], end: postWindowS[1], window: 'Post' },
        ],
        encode: { x: 'start', x1: 'end', color: 'window' },
        scale: {
          color: {
            type: 'ordinal',
            domain: ['Baseline', 'Post'],
            range: [BASELINE_COLOUR, POST_COLOUR],
          },
        },
        style: { fillOpacity: 0.14 },
        labels: [
          {
            text: 'window',
            position: 'top-left',
            dx: 4,
            dy: 4,
            fill: GYRE_COLORS.ink,
            fontSize: 11,
          },
        ],
        tooltip: false,
      },
      {
        type: 'area',
        data: band,
        encode: { x: 'timeS', y: 'ciLowHz', y1: 'ciHighHz' },
        style: { fill: MEAN_COLOUR, fillOpacity: 0.2 },
        tooltip: {
          items: [
            { channel: 'y', name: '95 % CI low', valueFormatter: hz },
            { channel: 'y1', name: '95 % CI high', valueFormatter: hz },
          ],
        },
      },
      {
        type: 'line',
        data: points,
        encode: { x: 'timeS', y: 'meanHz' },
        style: { stroke: MEAN_COLOUR, lineWidth: 2 },
        tooltip: {
          title: (d: OnsetCurvePoint) => `${d.timeS.toFixed(3)} s`,
          items: [{ channel: 'y', name: seriesName, valueFormatter: hz }],
        },
      },
      {
        type: 'lineX',
        data: [0],
        style: { stroke: GYRE_COLORS.ink, lineDash: [4, 3], lineWidth: 1.5 },
        labels: [
          {
            text: 'Onset',
            position: 'bottom-right',
            dx: 4,
            dy: -4,
            fill: GYRE_COLORS.ink,
            fontSize: 11,
          },
        ],
        tooltip: false,
      },
    ],
  });
}
