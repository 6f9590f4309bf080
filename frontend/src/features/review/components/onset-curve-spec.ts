import { linearAxis, MIN_AXIS_SPAN_HZ, type OnsetCurveView } from '@gyre/shared';
import { CHART_PALETTE, GYRE_COLORS } from '../../../app/theme';
import {
  axisWithUnit,
  gyreView,
  labelsOf,
  linearScaleOf,
  xTickCount,
  yTickCount,
  type PlotSpec,
} from '../../../components/charts/plot-spec';
import { formatHz, formatQuantity } from '../../../lib/format';

export interface OnsetCurvePoint {
  timeS: number;
  meanHz: number;
  ciLowHz: number | null;
  ciHighHz: number | null;
}

/** Pairs the curve with its time axis, leaving out points where the mean is undefined. */
export function onsetCurvePoints(timeS: number[], curve: OnsetCurveView): OnsetCurvePoint[] {
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
/** Conditions' curves take the palette's colours the mean and the windows leave free. */
const CONDITION_COLOURS = [CHART_PALETTE[1], CHART_PALETTE[3], CHART_PALETTE[5]];

/**
 * How the `index`-th condition's curve is drawn: the three free colours, solid, then again
 * dashed, so up to six conditions stay apart (beyond that the key's labels tell them apart).
 */
export function conditionStroke(index: number): { colour: string; dashed: boolean } {
  return {
    colour: CONDITION_COLOURS[index % CONDITION_COLOURS.length],
    dashed: Math.floor(index / CONDITION_COLOURS.length) % 2 === 1,
  };
}

/** A condition's mean curve drawn over the region of interest's. */
export interface OnsetCurveOverlay {
  name: string;
  colour: string;
  dashed: boolean;
  points: OnsetCurvePoint[];
}

const hz = (value: number) => formatHz(value);

/** Room above the plot area for the "Onset" label, so the curve can never cross it. */
const ONSET_LABEL_ROOM_PX = 22;

/**
 * Mean instantaneous frequency around onset with its 95 % CI band, the baseline and post
 * windows shaded behind it (named in the legend beside the chart, so their labels never
 * collide at narrow widths) and a dashed line at onset (0 s), labelled above the plot area.
 * Ticks from shared/src/chart-ticks.ts: the time axis widened to whole steps (−1.0 to +2.0 s
 * for the usual epoch), signed like the windows; the frequency axis with distinct labels.
 */
export function onsetCurveSpec(options: {
  points: OnsetCurvePoint[];
  baselineWindowS: [number, number];
  postWindowS: [number, number];
  seriesName: string;
  widthPx?: number;
  heightPx?: number;
  /** Conditions' mean curves, each a line of its own colour (no band, to stay readable). */
  overlays?: OnsetCurveOverlay[];
}): PlotSpec {
  const { points, baselineWindowS, postWindowS, seriesName } = options;
  const overlays = options.overlays ?? [];
  const widthPx = options.widthPx ?? 640;
  const heightPx = options.heightPx ?? 300;
  const band = points.filter((p) => p.ciLowHz !== null && p.ciHighHz !== null);
  const first = points[0]?.timeS ?? -1;
  const last = points[points.length - 1]?.timeS ?? 2;
  const x = linearAxis(first, last, {
    count: xTickCount(widthPx, 56),
    minDecimals: 1,
    signed: true,
  });
  const values = [...points, ...overlays.flatMap((o) => o.points)].flatMap((p) =>
    [p.meanHz, p.ciLowHz, p.ciHighHz].filter((v): v is number => v !== null && Number.isFinite(v)),
  );
  const y = linearAxis(Math.min(...values), Math.max(...values), {
    count: yTickCount(heightPx - ONSET_LABEL_ROOM_PX),
    minSpan: MIN_AXIS_SPAN_HZ,
  });
  return gyreView({
    padding: 'auto',
    marginTop: ONSET_LABEL_ROOM_PX,
    scale: { x: linearScaleOf(x), y: linearScaleOf(y) },
    axis: {
      x: axisWithUnit('Time from onset', 's', { ticks: x }),
      y: axisWithUnit('Mean instantaneous frequency', 'Hz', { ticks: y }),
    },
    axisLabels: { x: labelsOf(x), y: labelsOf(y) },
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
          title: (d: OnsetCurvePoint) => formatQuantity(d.timeS, 'sampleTimeS'),
          items: [{ channel: 'y', name: seriesName, valueFormatter: hz }],
        },
      },
      ...overlays.map((overlay) => ({
        type: 'line' as const,
        data: overlay.points,
        encode: { x: 'timeS', y: 'meanHz' },
        style: {
          stroke: overlay.colour,
          lineWidth: 1.5,
          ...(overlay.dashed ? { lineDash: [6, 3] } : {}),
        },
        tooltip: {
          items: [{ channel: 'y', name: overlay.name, valueFormatter: hz }],
        },
      })),
      {
        type: 'lineX',
        data: [0],
        style: { stroke: GYRE_COLORS.ink, lineDash: [4, 3], lineWidth: 1.5 },
        // Above the plot area (in the view's top margin): no curve or band reaches there.
        labels: [
          {
            text: 'Onset',
            position: 'top',
            dy: -6,
            textAlign: 'center',
            textBaseline: 'bottom',
            fill: GYRE_COLORS.ink,
            fontSize: 11,
          },
        ],
        tooltip: false,
      },
    ],
  });
}
