import type { ChannelStatsView } from '@gyre/shared';
import type { ExportRecording } from './export-model';

/** The measures of the exports (every one in Hz). */
export const MEASURES = {
  paf: 'Peak alpha frequency of the region of interest (resting recording).',
  cog: 'Centre of gravity of alpha power in the region of interest (resting recording).',
  delta_f:
    'Δf: mean instantaneous frequency after onset minus before onset (task recording); negative = slowing.',
  baseline_f:
    'Mean instantaneous frequency in the baseline window before onset (task, per channel).',
  post_f: 'Mean instantaneous frequency in the post-onset window (task, per channel).',
  delta_f_cycles:
    'Δf of the cycle-by-cycle cross-check: frequency from the periods between extrema in bursts (task, region of interest).',
} as const;
export type Measure = keyof typeof MEASURES;

/** One measured value: the region of interest's or one channel's. */
export interface MeasureRow {
  measure: Measure;
  scope: 'roi' | 'channel';
  /** The file's channel label; null for the region of interest. */
  channel: string | null;
  channelCanonical: string | null;
  value: number | null;
  ciLow: number | null;
  ciHigh: number | null;
  pValue: number | null;
  trialsKept: number | null;
  trialsTotal: number | null;
  channelInRoi: boolean | null;
  channelFlat: boolean | null;
  channelSaturated: boolean | null;
  /** Share of the samples the amplitude gate left out; null when the gate was off. */
  gatedShare: number | null;
}

const NO_EXTRAS = {
  channel: null,
  channelCanonical: null,
  ciLow: null,
  ciHigh: null,
  pValue: null,
  trialsKept: null,
  trialsTotal: null,
  channelInRoi: null,
  channelFlat: null,
  channelSaturated: null,
  gatedShare: null,
} as const;

/** A 95 % interval's ends as the rows' two columns; both null without one. */
function ciOf(ciHz: readonly [number, number] | null): Pick<MeasureRow, 'ciLow' | 'ciHigh'> {
  return { ciLow: ciHz?.[0] ?? null, ciHigh: ciHz?.[1] ?? null };
}

/**
 * The rows of one recording. The region of interest's rows are always written, with an empty
 * value when there is none (no clear peak, no channel left), so a missing number is seen
 * beside its reason; channel rows are written for task recordings, one per channel and measure.
 */
export function measuresOf(recording: ExportRecording): MeasureRow[] {
  const { run } = recording;
  if (recording.kind === 'resting') {
    return [
      { ...NO_EXTRAS, measure: 'paf', scope: 'roi', value: run.pafHz },
      { ...NO_EXTRAS, measure: 'cog', scope: 'roi', value: run.cogHz },
    ];
  }
  const rows: MeasureRow[] = [
    {
      ...NO_EXTRAS,
      measure: 'delta_f',
      scope: 'roi',
      value: run.roiDeltaFHz,
      ...ciOf(run.roiCiHz),
      pValue: run.roiPValue,
      trialsKept: run.trialsKept,
      trialsTotal: run.trialsTotal,
      gatedShare: roiGatedShare(recording),
    },
  ];
  const cycles = recording.depth?.cycles ?? null;
  if (cycles !== null) {
    rows.push({
      ...NO_EXTRAS,
      measure: 'delta_f_cycles',
      scope: 'roi',
      value: cycles.deltaFHz,
      ...ciOf(cycles.ciHz),
      trialsKept: cycles.trialsUsed,
      trialsTotal: cycles.trialsTotal,
    });
  }
  const quality = new Map(recording.quality.channels.map((c) => [c.label, c]));
  for (const channel of recording.channels) {
    const q = quality.get(channel.label);
    const base = {
      ...NO_EXTRAS,
      scope: 'channel' as const,
      channel: channel.label,
      channelCanonical: channel.canonical,
      channelInRoi: channel.inRoi,
      channelFlat: q?.flat ?? null,
      channelSaturated: q?.saturated ?? null,
      gatedShare: gatedShareOf([channel]),
    };
    rows.push(
      {
        ...base,
        measure: 'delta_f',
        value: channel.deltaFHz,
        ...ciOf(channel.ciHz),
        pValue: channel.pValue,
        trialsKept: channel.trials,
      },
      { ...base, measure: 'baseline_f', value: channel.baselineHz, trialsKept: channel.trials },
      { ...base, measure: 'post_f', value: channel.postHz, trialsKept: channel.trials },
    );
  }
  return rows;
}

/** Samples the gate left out over these channels, as a share; null when none was gated. */
function gatedShareOf(channels: readonly ChannelStatsView[]): number | null {
  let excluded = 0;
  let total = 0;
  for (const { amplitudeGate: gate } of channels) {
    if (gate === null || gate.percentile === null) continue;
    excluded += gate.excludedSamples;
    total += gate.totalSamples;
  }
  return total === 0 ? null : excluded / total;
}

/** The gate's share over the region-of-interest channels the run used. */
function roiGatedShare(recording: ExportRecording): number | null {
  const used = new Set(recording.run.roiUsage.used);
  return gatedShareOf(recording.channels.filter((c) => used.has(c.label)));
}
