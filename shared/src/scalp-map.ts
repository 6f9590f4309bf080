import { scaleLinear } from 'd3-scale';
import type { ScalpMapMeasure } from './analysis-depth';
import { normaliseChannelLabel } from './channel-labels';
import { CHART_COLORS, GYRE_COLORS } from './palette';
import { type AxisTick, linearAxis, MIN_AXIS_SPAN_HZ } from './chart-ticks';
import type { ChannelStatsView, QualityView, RoiOmissionReason, RoiUsageView } from './recordings';
import { scalpPositionOf, type ScalpPoint } from './scalp-positions';

/**
 * What a scalp map shows, worked out once for Review and the visit report: each channel of a
 * run at its 10-10 position with its value, or why it has none, and the colour scale.
 */

/**
 * How a channel is drawn: coloured by its value; grey (`no-value`: in the file, but the
 * computation gave no number); hollow with a cross (`left-out`: flat, saturated, another rate,
 * or excluded by the visit's override); dashed and hollow (`missing`: asked for, not in the file).
 */
export type ScalpChannelMark = 'value' | 'no-value' | 'left-out' | 'missing';

export interface ScalpMapChannel {
  /** Canonical 10-10 name. */
  name: string;
  /** The file's label (the asked-for name when the channel is missing). */
  label: string;
  point: ScalpPoint;
  /** The measure's value, also for a channel left out of the region of interest. */
  valueHz: number | null;
  mark: ScalpChannelMark;
  /** Why the channel was left out; null when it was not. */
  omission: RoiOmissionReason | null;
}

export interface ScalpColourScale {
  /** The colour bar's extent, Hz: nice ends; symmetric around 0 for Δf. */
  domainHz: [number, number];
  /** Labelled ticks of the colour bar (number-format: true minus, + on Δf). */
  ticks: AxisTick[];
  /** Δf: a diverging scale centred on 0; PAF and CoG: a sequential one. */
  diverging: boolean;
}

export interface ScalpMapModel {
  measure: ScalpMapMeasure;
  channels: ScalpMapChannel[];
  /** File labels with a value but no 10-10 position (not drawn; named beside the map). */
  unplaced: string[];
  /** Null when no drawn channel has a value. */
  scale: ScalpColourScale | null;
}

/** The per-channel numbers a map reads (of a channel's stats: its names and the three values). */
export type ScalpChannelValues = Pick<
  ChannelStatsView,
  'label' | 'canonical' | 'pafHz' | 'cogHz' | 'deltaFHz'
>;

/** The parts of a run's results a map is made from. */
export interface ScalpMapSource {
  channels: readonly ScalpChannelValues[];
  roiUsage: RoiUsageView;
  quality: Pick<QualityView, 'flatChannels' | 'saturatedChannels'>;
}

/** PAF and CoG, low to high: the trial raster's ramp (teal, sage, olive, amber). */
export const SCALP_SEQUENTIAL_STOPS: readonly string[] = [
  GYRE_COLORS.primary,
  CHART_COLORS.sage,
  CHART_COLORS.olive,
  GYRE_COLORS.amber,
];

/**
 * Δf, negative to positive: slower in blue, no change in white, faster in amber (lower
 * frequencies cool and higher ones amber, as on the sequential scale).
 */
export const SCALP_DIVERGING_STOPS: readonly string[] = [
  CHART_COLORS.blue,
  GYRE_COLORS.paper,
  GYRE_COLORS.amber,
];

/** The measure's name, for titles, colour bars and tables. */
export const SCALP_MEASURE_NAMES: Record<ScalpMapMeasure, string> = {
  paf: 'Peak alpha frequency (PAF)',
  cog: 'Centre of gravity (CoG)',
  deltaF: 'Δf (post − baseline)',
};

function valueOf(channel: ScalpChannelValues, measure: ScalpMapMeasure): number | null {
  const value =
    measure === 'paf' ? channel.pafHz : measure === 'cog' ? channel.cogHz : channel.deltaFHz;
  return value !== null && Number.isFinite(value) ? value : null;
}

/** Why a channel (by file label or 10-10 name, any case) did not count; null when it did. */
function omissionOf(source: ScalpMapSource, label: string, name: string): RoiOmissionReason | null {
  const same = (other: string) => {
    const lower = other.toLowerCase();
    return lower === label.toLowerCase() || lower === name.toLowerCase();
  };
  if (source.quality.flatChannels.some(same)) return 'flat';
  if (source.quality.saturatedChannels.some(same)) return 'saturated';
  return source.roiUsage.leftOut.find((o) => same(o.label))?.reason ?? null;
}

/** Sequential over the values' extent, or symmetric around 0 for a change. */
function colourScaleOf(values: number[], diverging: boolean): ScalpColourScale | null {
  if (values.length === 0) return null;
  const axis = diverging
    ? (() => {
        const reach = Math.max(MIN_AXIS_SPAN_HZ / 2, ...values.map(Math.abs));
        return linearAxis(-reach, reach, { count: 4, signed: true });
      })()
    : linearAxis(Math.min(...values), Math.max(...values), {
        count: 4,
        minSpan: MIN_AXIS_SPAN_HZ,
      });
  return { domainHz: axis.domain, ticks: axis.ticks, diverging };
}

/**
 * The map of one measure: every channel of the run with a 10-10 position (the first of two
 * labels naming the same electrode), then the region-of-interest channels not in the file.
 */
export function scalpMapOf(source: ScalpMapSource, measure: ScalpMapMeasure): ScalpMapModel {
  const channels: ScalpMapChannel[] = [];
  const unplaced: string[] = [];
  const seen = new Set<string>();
  for (const channel of source.channels) {
    const name = channel.canonical ?? normaliseChannelLabel(channel.label);
    const point = name === null ? null : scalpPositionOf(name);
    const valueHz = valueOf(channel, measure);
    if (name === null || point === null) {
      if (valueHz !== null) unplaced.push(channel.label);
      continue;
    }
    if (seen.has(name)) continue;
    seen.add(name);
    const omission = omissionOf(source, channel.label, name);
    const mark = omission !== null ? 'left-out' : valueHz === null ? 'no-value' : 'value';
    channels.push({ name, label: channel.label, point, valueHz, mark, omission });
  }
  for (const missing of source.roiUsage.leftOut) {
    if (missing.reason !== 'missing') continue;
    const name = normaliseChannelLabel(missing.label);
    const point = name === null ? null : scalpPositionOf(name);
    if (name === null || point === null || seen.has(name)) continue;
    seen.add(name);
    channels.push({
      name,
      label: missing.label,
      point,
      valueHz: null,
      mark: 'missing',
      omission: 'missing',
    });
  }
  const coloured = channels.filter((c) => c.mark === 'value').map((c) => c.valueHz as number);
  return { measure, channels, unplaced, scale: colourScaleOf(coloured, measure === 'deltaF') };
}

/** One line of a map's key: the channels drawn with one mark, named, with why. */
export interface ScalpMarkLine {
  mark: Exclude<ScalpChannelMark, 'value'>;
  text: string;
}

/**
 * The channels a map could not colour, grouped by mark, each named (left-out ones with the
 * reason in `omissionWords`'s words), then those with no 10-10 position; empty when none.
 */
export function scalpMarkLines(
  map: ScalpMapModel,
  omissionWords: (reason: RoiOmissionReason) => string,
): { lines: ScalpMarkLine[]; unplaced: string | null } {
  const names = (mark: ScalpChannelMark) => map.channels.filter((c) => c.mark === mark);
  const lines: ScalpMarkLine[] = [];
  const leftOut = names('left-out').map(
    (c) => `${c.name} (${omissionWords(c.omission ?? 'excluded')})`,
  );
  if (leftOut.length > 0) lines.push({ mark: 'left-out', text: `Left out: ${leftOut.join(', ')}` });
  const missing = names('missing').map((c) => c.name);
  if (missing.length > 0) {
    lines.push({ mark: 'missing', text: `Asked for, not in the file: ${missing.join(', ')}` });
  }
  const noValue = names('no-value').map((c) => c.name);
  if (noValue.length > 0) lines.push({ mark: 'no-value', text: `No value: ${noValue.join(', ')}` });
  const unplaced =
    map.unplaced.length === 0 ? null : `No 10-10 position, not drawn: ${map.unplaced.join(', ')}`;
  return { lines, unplaced };
}

/**
 * The colour of a value on a scale: `stops` (by default the scale's kind's) spread evenly over
 * the domain (low to high; for a diverging scale the middle stop sits at 0), interpolated in RGB by d3-scale, clamped at the
 * ends. Returns `#rrggbb`, which both SVG and pdfkit read.
 */
export function scalpColourOf(
  valueHz: number,
  scale: Pick<ScalpColourScale, 'domainHz' | 'diverging'>,
  stops: readonly string[] = scale.diverging ? SCALP_DIVERGING_STOPS : SCALP_SEQUENTIAL_STOPS,
): string {
  const [low, high] = scale.domainHz;
  const at = stops.map((_, i) => low + ((high - low) * i) / Math.max(1, stops.length - 1));
  const rgb = scaleLinear<string>().domain(at).range(stops).clamp(true)(valueHz);
  // d3-interpolate writes `rgb(r, g, b)`.
  const channels = /^rgb\((\d+), (\d+), (\d+)\)$/.exec(rgb);
  if (channels === null) throw new Error(`Unexpected colour ${rgb} from d3-scale.`);
  return `#${channels
    .slice(1)
    .map((c) => Number(c).toString(16).padStart(2, '0'))
    .join('')}`;
}
