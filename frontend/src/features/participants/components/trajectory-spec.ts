import {
  dateAxis,
  formatUtcDay,
  linearAxis,
  MIN_AXIS_SPAN_HZ,
  type TrajectoryView,
  type TrajectoryVisitView,
} from '@gyre/shared';
import { CHART_PALETTE, GYRE_COLORS } from '../../../app/theme';
import {
  axisWithUnit,
  gyreView,
  labelsOf,
  linearScaleOf,
  timeScaleOf,
  xTickCount,
  yTickCount,
  type MarkSpec,
  type PlotSpec,
} from '../../../components/charts/plot-spec';
import { formatDeltaHz, formatHz } from '../../../lib/format';
import { theilSenLine } from './theil-sen-line';

export const SERIES_COLOUR = {
  PAF: CHART_PALETTE[3],
  CoG: CHART_PALETTE[4],
  Δf: CHART_PALETTE[0],
} as const;
export type TrajectorySeries = keyof typeof SERIES_COLOUR;

export interface TrajectoryPoint {
  series: TrajectorySeries;
  timeMs: number;
  date: Date;
  valueHz: number;
  label: string;
  flagged: boolean;
}

const PICK: Record<TrajectorySeries, (v: TrajectoryVisitView) => number | null> = {
  PAF: (v) => v.pafHz,
  CoG: (v) => v.cogHz,
  Δf: (v) => v.deltaFHz,
};

/**
 * A visit date (`YYYY-MM-DD`) as milliseconds at UTC midnight: the axis's ticks are UTC
 * days, so a date lands on its own tick in every time zone.
 */
export function visitDateMs(date: string): number {
  return Date.parse(/^\d{4}-\d{2}-\d{2}$/.test(date) ? `${date}T00:00:00Z` : date);
}

/** The visits where a series has a value, on a millisecond time axis (UTC). */
export function seriesPoints(
  visits: TrajectoryVisitView[],
  series: TrajectorySeries,
): TrajectoryPoint[] {
  return visits.flatMap((visit) => {
    const value = PICK[series](visit);
    if (value === null || !Number.isFinite(value)) return [];
    return [
      {
        series,
        timeMs: visitDateMs(visit.date),
        date: new Date(visitDateMs(visit.date)),
        valueHz: value,
        label: visit.label,
        flagged: visit.flagged,
      },
    ];
  });
}

const dateLabel = (ms: number) => formatUtcDay(ms);

function seriesMarks(points: TrajectoryPoint[], slopeHzPerYear: number | null): MarkSpec[] {
  if (points.length === 0) return [];
  const series = points[0].series;
  const colour = SERIES_COLOUR[series];
  const marks: MarkSpec[] = [
    {
      type: 'line',
      data: points,
      encode: { x: 'date', y: 'valueHz' },
      style: { stroke: colour, lineWidth: 2 },
      tooltip: false,
    },
    {
      type: 'point',
      data: points,
      encode: { x: 'date', y: 'valueHz', shape: 'point', size: 5 },
      style: {
        fill: (d: TrajectoryPoint) => (d.flagged ? GYRE_COLORS.amber : colour),
        stroke: (d: TrajectoryPoint) => (d.flagged ? GYRE_COLORS.amber : GYRE_COLORS.paper),
        lineWidth: 1.5,
      },
      tooltip: {
        title: (d: TrajectoryPoint) =>
          `${d.label}, ${dateLabel(d.timeMs)}${d.flagged ? ' (flagged)' : ''}`,
        items: [
          {
            channel: 'y',
            name: series,
            valueFormatter: (v: number) => (series === 'Δf' ? formatDeltaHz(v) : formatHz(v)),
          },
        ],
      },
    },
  ];
  const trend = theilSenLine(points, slopeHzPerYear);
  if (trend !== null) {
    marks.push({
      type: 'line',
      data: trend.map((p) => ({ ...p, date: new Date(p.timeMs), series })),
      encode: { x: 'date', y: 'valueHz' },
      style: { stroke: colour, lineWidth: 1.5, lineDash: [6, 4], strokeOpacity: 0.8 },
      tooltip: false,
    });
  }
  return marks;
}

function flaggedMarks(visits: TrajectoryVisitView[]): MarkSpec[] {
  const flagged = visits.filter((v) => v.flagged).map((v) => new Date(visitDateMs(v.date)));
  if (flagged.length === 0) return [];
  return [
    {
      type: 'lineX',
      data: flagged,
      style: { stroke: GYRE_COLORS.amber, lineDash: [3, 3], lineWidth: 1.5 },
      labels: [
        { text: 'Flagged', position: 'top-right', dx: 4, fill: GYRE_COLORS.amber, fontSize: 11 },
      ],
      tooltip: false,
    },
  ];
}

function timeDomain(visits: TrajectoryVisitView[]): [number, number] {
  const times = visits.map((v) => visitDateMs(v.date));
  const first = Math.min(...times);
  const last = Math.max(...times);
  // A month either side keeps the first and last visit off the plot's edge.
  const pad = Math.max(30 * 86_400_000, (last - first) * 0.05);
  return [first - pad, last + pad];
}

/** Every value a panel draws, so that its y axis covers the trend line's ends too. */
function panelValues(marks: MarkSpec[]): number[] {
  return marks
    .flatMap((mark) =>
      Array.isArray(mark.data)
        ? (mark.data as unknown[]).flatMap((d) =>
            typeof d === 'object' && d !== null && 'valueHz' in d ? [Number(d.valueHz)] : [],
          )
        : [],
    )
    .filter(Number.isFinite);
}

/**
 * A panel over the visit dates. Ticks from shared/src/chart-ticks.ts: calendar ticks that
 * name each month or year once, and Hz at a nice step with distinct labels.
 */
function view(
  visits: TrajectoryVisitView[],
  yTitle: string,
  children: MarkSpec[],
  size: ChartSize,
  includeZero = false,
): PlotSpec {
  const [fromMs, toMs] = timeDomain(visits);
  const x = dateAxis(fromMs, toMs, { count: xTickCount(size.widthPx, 84) });
  const values = panelValues(children);
  if (includeZero) values.push(0);
  const y = linearAxis(Math.min(...values), Math.max(...values), {
    count: yTickCount(size.heightPx),
    minSpan: MIN_AXIS_SPAN_HZ,
  });
  return gyreView({
    padding: 'auto',
    scale: { x: timeScaleOf(x), y: linearScaleOf(y) },
    axis: {
      x: axisWithUnit('Visit date', null, { ticks: x }),
      y: axisWithUnit(yTitle, 'Hz', { ticks: y }),
    },
    axisLabels: { x: labelsOf(x), y: labelsOf(y) },
    legend: false,
    children,
  });
}

export interface ChartSize {
  widthPx: number;
  heightPx: number;
}

const DEFAULT_SIZE: ChartSize = { widthPx: 640, heightPx: 280 };

/** PAF and CoG over the visit dates, with their Theil–Sen trends and flagged visits marked. */
export function alphaFrequencySpec(
  trajectory: TrajectoryView,
  size: ChartSize = DEFAULT_SIZE,
): PlotSpec {
  const { visits, slopesHzPerYear } = trajectory;
  return view(
    visits,
    'Resting alpha frequency',
    [
      ...flaggedMarks(visits),
      ...seriesMarks(seriesPoints(visits, 'PAF'), slopesHzPerYear.paf),
      ...seriesMarks(seriesPoints(visits, 'CoG'), slopesHzPerYear.cog),
    ],
    size,
  );
}

/** Task Δf over the visit dates with the zero line (below zero = slowing after onset). */
export function onsetChangeSpec(
  trajectory: TrajectoryView,
  size: ChartSize = DEFAULT_SIZE,
): PlotSpec {
  const { visits, slopesHzPerYear } = trajectory;
  return view(
    visits,
    'Onset Δf (post − baseline)',
    [
      ...flaggedMarks(visits),
      {
        type: 'lineY',
        data: [0],
        style: { stroke: GYRE_COLORS.ink, lineWidth: 1, strokeOpacity: 0.6 },
        tooltip: false,
      },
      ...seriesMarks(seriesPoints(visits, 'Δf'), slopesHzPerYear.deltaF),
    ],
    size,
    true,
  );
}
