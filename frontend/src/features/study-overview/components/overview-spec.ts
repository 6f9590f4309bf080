import {
  linearAxis,
  MIN_AXIS_SPAN_HZ,
  type OverviewMeasure,
  type OverviewStat,
  type StudyOverviewView,
} from '@gyre/shared';
import { CHART_PALETTE, GYRE_COLORS } from '../../../app/theme';
import {
  axisWithUnit,
  gyreView,
  labelsOf,
  linearScaleOf,
  yTickCount,
  type MarkSpec,
  type PlotSpec,
} from '../../../components/charts/plot-spec';
import { formatDeltaHz, formatHz, formatQuantityRange } from '../../../lib/format';

export type OverviewSplit = 'group' | 'site';

export const MEASURE_WORDS: Record<OverviewMeasure, { title: string; axis: string }> = {
  paf: { title: 'Peak alpha frequency at rest', axis: 'PAF' },
  cog: { title: 'Alpha centre of gravity at rest', axis: 'CoG' },
  deltaF: { title: 'Onset Δf in the task', axis: 'ROI Δf (post − baseline)' },
};

/** A group or site as the overview shows it, with its colour; `key` null = no group. */
export interface SplitEntry {
  key: string | null;
  name: string;
  colour: string;
}

export function splitEntries(overview: StudyOverviewView, split: OverviewSplit): SplitEntry[] {
  const named =
    split === 'group'
      ? overview.groups.map((g) => ({ key: g.id as string | null, name: g.name }))
      : overview.sites.map((s) => ({ key: s.id as string | null, name: s.name }));
  if (split === 'group' && overview.participants.some((p) => p.groupId === null)) {
    named.push({ key: null, name: 'No group' });
  }
  return named.map((entry, i) => ({ ...entry, colour: CHART_PALETTE[i % CHART_PALETTE.length] }));
}

export function statsOf(overview: StudyOverviewView, split: OverviewSplit): OverviewStat[] {
  return split === 'group' ? overview.byGroup : overview.bySite;
}

interface CoursePoint {
  participant: string;
  visit: string;
  value: number;
}

interface MeanPoint {
  visit: string;
  mean: number;
  ciLow: number | null;
  ciHigh: number | null;
  n: number;
  name: string;
}

/**
 * One measure over the planned visits: every participant's course as a faint line, and per
 * group (or site) the mean with its 95 % confidence band (Student t) and points.
 */
export function overviewSpec(
  overview: StudyOverviewView,
  measure: OverviewMeasure,
  split: OverviewSplit,
  heightPx = 260,
): PlotSpec {
  // Δf is a change: signed like everywhere else; PAF and CoG are plain frequencies.
  const quantity = measure === 'deltaF' ? 'deltaFHz' : 'frequencyHz';
  const hz = measure === 'deltaF' ? formatDeltaHz : formatHz;
  const names = overview.plannedVisits.map((p) => p.name);
  const courses: CoursePoint[] = overview.participants.flatMap((p) =>
    p.cells.flatMap((cell, i) => {
      const value = cell[measure];
      return value === null ? [] : [{ participant: p.id, visit: names[i], value }];
    }),
  );
  const stats = statsOf(overview, split).filter((s) => s.measure === measure);
  const marks: MarkSpec[] = [];
  if (courses.length > 0) {
    marks.push({
      type: 'line',
      data: courses,
      encode: { x: 'visit', y: 'value', series: 'participant' },
      style: { stroke: GYRE_COLORS.ink, strokeOpacity: 0.14, lineWidth: 1 },
      tooltip: false,
    });
  }
  for (const entry of splitEntries(overview, split)) {
    const means: MeanPoint[] = overview.plannedVisits.flatMap((pv) => {
      const s = stats.find((x) => x.plannedVisitId === pv.id && x.key === entry.key);
      return s === undefined || s.mean === null
        ? []
        : [
            {
              visit: pv.name,
              mean: s.mean,
              ciLow: s.ciLow,
              ciHigh: s.ciHigh,
              n: s.n,
              name: entry.name,
            },
          ];
    });
    if (means.length === 0) continue;
    const band = means.filter((m) => m.ciLow !== null && m.ciHigh !== null);
    if (band.length > 0) {
      marks.push({
        type: 'area',
        data: band,
        encode: { x: 'visit', y: 'ciLow', y1: 'ciHigh' },
        style: { fill: entry.colour, fillOpacity: 0.16 },
        tooltip: false,
      });
    }
    marks.push(
      {
        type: 'line',
        data: means,
        encode: { x: 'visit', y: 'mean' },
        style: { stroke: entry.colour, lineWidth: 2.5 },
        tooltip: false,
      },
      {
        type: 'point',
        data: means,
        encode: { x: 'visit', y: 'mean', shape: 'point', size: 5 },
        style: { fill: entry.colour, stroke: GYRE_COLORS.paper, lineWidth: 1.5 },
        tooltip: {
          title: (d: MeanPoint) => `${d.name}, ${d.visit} (n = ${d.n})`,
          items: [
            { channel: 'y', name: 'Mean', valueFormatter: hz },
            (d: MeanPoint) => ({
              name: '95 % CI',
              value:
                d.ciLow === null || d.ciHigh === null
                  ? 'needs two values'
                  : formatQuantityRange([d.ciLow, d.ciHigh], quantity),
            }),
          ],
        },
      },
    );
  }
  if (measure === 'deltaF') {
    marks.unshift({
      type: 'lineY',
      data: [0],
      style: { stroke: GYRE_COLORS.ink, lineWidth: 1, strokeOpacity: 0.6 },
      tooltip: false,
    });
  }
  // Ticks from shared/src/chart-ticks.ts over everything drawn: courses, means and bands.
  const drawn = [
    ...courses.map((c) => c.value),
    ...stats.flatMap((s) => [s.mean, s.ciLow, s.ciHigh]),
    ...(measure === 'deltaF' ? [0] : []),
  ].filter((v): v is number => v !== null && Number.isFinite(v));
  const y = linearAxis(Math.min(...drawn), Math.max(...drawn), {
    count: yTickCount(heightPx),
    minSpan: MIN_AXIS_SPAN_HZ,
  });
  return gyreView({
    padding: 'auto',
    scale: { x: { type: 'point', domain: names }, y: linearScaleOf(y) },
    axis: {
      x: { ...axisWithUnit('Planned visit', null), labelAutoRotate: false, labelAutoHide: true },
      y: axisWithUnit(MEASURE_WORDS[measure].axis, 'Hz', { ticks: y }),
    },
    axisLabels: { x: names, y: labelsOf(y) },
    legend: false,
    children: marks,
  });
}
