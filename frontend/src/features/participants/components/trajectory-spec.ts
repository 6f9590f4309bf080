import type { TrajectoryDto, TrajectoryVisitDto } from '@gyre/shared';
import dayjs from 'dayjs';
import { CHART_PALETTE, GYRE_COLORS } from '../../../app/theme';
import {
  axisWithUnit,
  gyreView,
  type MarkSpec,
  type PlotSpec,
} from '../../../components/charts/plot-spec';
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

const PICK: Record<TrajectorySeries, (v: TrajectoryVisitDto) => number | null> = {
  PAF: (v) => v.pafHz,
  CoG: (v) => v.cogHz,
  Δf: (v) => v.deltaFHz,
};

/** The visits where a series has a value, on a millisecond time axis (dayjs parses the date). */
export function seriesPoints(
  visits: TrajectoryVisitDto[],
  series: TrajectorySeries,
): TrajectoryPoint[] {
  return visits.flatMap((visit) => {
    const value = PICK[series](visit);
    if (value === null || !Number.isFinite(value)) return [];
    return [
      {
        series,
        timeMs: dayjs(visit.date).valueOf(),
        date: dayjs(visit.date).toDate(),
        valueHz: value,
        label: visit.label,
        flagged: visit.flagged,
      },
    ];
  });
}

const dateLabel = (ms: number) => dayjs(ms).format('D MMM YYYY');

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
          { channel: 'y', name: series, valueFormatter: (v: number) => `${v.toFixed(2)} Hz` },
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

function flaggedMarks(visits: TrajectoryVisitDto[]): MarkSpec[] {
  const flagged = visits.filter((v) => v.flagged).map((v) => dayjs(v.date).toDate());
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

function timeDomain(visits: TrajectoryVisitDto[]): [number, number] {
  const times = visits.map((v) => dayjs(v.date).valueOf());
  const first = Math.min(...times);
  const last = Math.max(...times);
  // A month either side keeps the first and last visit off the plot's edge.
  const pad = Math.max(30 * 86_400_000, (last - first) * 0.05);
  return [first - pad, last + pad];
}

function view(visits: TrajectoryVisitDto[], yTitle: string, children: MarkSpec[]): PlotSpec {
  return gyreView({
    padding: 'auto',
    scale: {
      x: { type: 'time', domain: timeDomain(visits).map((ms) => new Date(ms)), nice: false },
      y: { nice: true, zero: false },
    },
    axis: {
      x: {
        ...axisWithUnit('Visit date', null, {
          labelFormatter: (v) => dayjs(v).format('MMM YYYY'),
        }),
        labelAutoRotate: false,
        labelAutoHide: true,
      },
      y: axisWithUnit(yTitle, 'Hz', { labelFormatter: (v) => v.toFixed(2) }),
    },
    legend: false,
    children,
  });
}

/** PAF and CoG over the visit dates, with their Theil–Sen trends and flagged visits marked. */
export function alphaFrequencySpec(trajectory: TrajectoryDto): PlotSpec {
  const { visits, slopesHzPerYear } = trajectory;
  return view(visits, 'Resting alpha frequency', [
    ...flaggedMarks(visits),
    ...seriesMarks(seriesPoints(visits, 'PAF'), slopesHzPerYear.paf),
    ...seriesMarks(seriesPoints(visits, 'CoG'), slopesHzPerYear.cog),
  ]);
}

/** Task Δf over the visit dates with the zero line (below zero = slowing after onset). */
export function onsetChangeSpec(trajectory: TrajectoryDto): PlotSpec {
  const { visits, slopesHzPerYear } = trajectory;
  return view(visits, 'Onset Δf (post − baseline)', [
    ...flaggedMarks(visits),
    {
      type: 'lineY',
      data: [0],
      style: { stroke: GYRE_COLORS.ink, lineWidth: 1, strokeOpacity: 0.6 },
      tooltip: false,
    },
    ...seriesMarks(seriesPoints(visits, 'Δf'), slopesHzPerYear.deltaF),
  ]);
}
