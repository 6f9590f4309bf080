/**
 * The region of interest's cycle-by-cycle Δf (docs/method.md, "Cycle-by-cycle cross-check"),
 * beside the phase-based one: per kept trial, the channels' cycle frequencies averaged over
 * the channels that have one (as the region's frequency epochs are averaged trial by trial),
 * then Δf = post − baseline over the trials with a value in both windows, with the same
 * bootstrap interval as the phase-based Δf.
 */
import type { CycleEstimateView } from '@gyre/shared';
import { bootstrapMeanInterval } from '../trials/onset-statistics';
import type { ChannelCycleTrials } from './channel-cycles';

export interface CycleEstimateOptions {
  /** The region's kept trials. */
  trials: readonly number[];
  /** The phase-based Δf of the region, Hz. */
  phaseDeltaFHz: number | null;
  /** A disagreement above this is flagged, Hz (the settings' `cycleDisagreementHz`). */
  disagreementHz: number;
  resamples: number;
  seed: number;
}

function channelMean(values: readonly Float64Array[], trial: number): number {
  let sum = 0;
  let count = 0;
  for (const v of values) {
    if (!Number.isNaN(v[trial])) {
      sum += v[trial];
      count++;
    }
  }
  return count > 0 ? sum / count : NaN;
}

const mean = (values: readonly number[]): number | null =>
  values.length > 0 ? values.reduce((a, b) => a + b, 0) / values.length : null;

/** The cycle-by-cycle estimate of the region from its channels' trial values. */
export function cycleEstimate(
  channels: readonly ChannelCycleTrials[],
  options: CycleEstimateOptions,
): CycleEstimateView {
  const baseline: number[] = [];
  const post: number[] = [];
  let cycles = 0;
  let burstCycles = 0;
  for (const trial of options.trials) {
    for (const c of channels) {
      cycles += c.cycles[trial];
      burstCycles += c.burstCycles[trial];
    }
    const b = channelMean(
      channels.map((c) => c.baselineHz),
      trial,
    );
    const p = channelMean(
      channels.map((c) => c.postHz),
      trial,
    );
    if (!Number.isNaN(b) && !Number.isNaN(p)) {
      baseline.push(b);
      post.push(p);
    }
  }
  const delta = post.map((p, i) => p - baseline[i]);
  const deltaFHz = mean(delta);
  const disagreementHz =
    deltaFHz !== null && options.phaseDeltaFHz !== null
      ? Math.abs(deltaFHz - options.phaseDeltaFHz)
      : null;
  return {
    baselineHz: mean(baseline),
    postHz: mean(post),
    deltaFHz,
    ciHz: bootstrapMeanInterval(delta, { resamples: options.resamples, seed: options.seed }),
    trialsUsed: delta.length,
    trialsTotal: options.trials.length,
    burstCycleShare: cycles > 0 ? burstCycles / cycles : null,
    disagreementHz,
    disagrees: disagreementHz !== null && disagreementHz > options.disagreementHz,
  };
}
