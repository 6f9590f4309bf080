/**
 * The cycle-by-cycle frequency of one channel's trials (docs/method.md, "Cycle-by-cycle
 * cross-check"): cycles of the whole continuous channel (`findCycles`), their bursts
 * (`detectBursts`), and per trial the mean frequency (1 / period) of the burst cycles whose
 * centre lies in the baseline and in the post window.
 */
import {
  defaultEdgePaddingS,
  FrequencySlidingWorkspace,
  narrowBandAnalytic,
} from '../frequency/frequency-sliding';
import { BurstThresholds, DEFAULT_BURST_THRESHOLDS, detectBursts } from './burst-detection';
import { CycleFeatures, findCycles } from './cycle-features';

/**
 * Band of the broadband copy the extrema are read from, Hz: wide enough to keep an alpha
 * rhythm's sharp peaks (harmonics up to 30 Hz), narrow enough to drop slow drift and muscle
 * noise that would move the extrema (common practice: Cole & Voytek 2019 low-pass the
 * signal before reading its extrema; these edges are Gyre's choice).
 */
export const CYCLE_BROADBAND_HZ: readonly [number, number] = [1, 30];

/** Per trial of the plan (NaN / 0 for trials not asked for). */
export interface ChannelCycleTrials {
  /** Mean frequency of the burst cycles centred in the baseline window, Hz; NaN when none. */
  baselineHz: Float64Array;
  postHz: Float64Array;
  /** Cycles centred in either window, and how many of them are in a burst. */
  cycles: Int32Array;
  burstCycles: Int32Array;
}

export interface CycleSearchOptions {
  sampleRateHz: number;
  /** The run's analysis band, Hz: the narrow-band copy whose zero-crossings split the cycles. */
  bandHz: readonly [number, number];
  transitionFraction?: number;
  thresholds?: Readonly<BurstThresholds>;
}

export interface ChannelCycleOptions extends CycleSearchOptions {
  /** Every onset of the plan, s from the first sample of `samples`. */
  onsetsS: readonly number[];
  /** The trials to measure (indices into `onsetsS`). */
  trials: readonly number[];
  baselineWindowS: readonly [number, number];
  postWindowS: readonly [number, number];
}

/**
 * Buffers reused from channel to channel: `transform` may be the caller's frequency-sliding
 * workspace (both copies are padded as the frequency sliding pads, so the transform size is
 * the same and nothing is allocated again), plus the narrow-band copy.
 */
export class CycleWorkspace {
  private narrowCopy = new Float64Array(0);

  constructor(readonly transform: FrequencySlidingWorkspace = new FrequencySlidingWorkspace()) {}

  narrowCopyFor(n: number): Float64Array {
    if (this.narrowCopy.length < n) this.narrowCopy = new Float64Array(n);
    return this.narrowCopy.subarray(0, n);
  }
}

/** First index in ascending `values` at or above `x`. */
function lowerBound(values: Float64Array, x: number): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (values[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The cycles of one continuous channel and which of them are in a burst. */
export function cyclesOfChannel(
  samples: Float32Array | Float64Array,
  options: CycleSearchOptions,
  workspace: CycleWorkspace = new CycleWorkspace(),
): { cycles: CycleFeatures; burst: Uint8Array } {
  const fs = options.sampleRateHz;
  const narrowOptions = {
    sampleRateHz: fs,
    method: 'filter' as const,
    bandHz: options.bandHz,
    transitionFraction: options.transitionFraction,
  };
  // The narrow band's padding for both copies: one transform size, one workspace. The
  // broadband copy's 1 Hz edge then needs a few seconds to settle at the recording's ends,
  // so cycles there may be placed slightly off (common practice accepts edge effects of
  // this size; the frequency sliding's own padding is the longer one for alpha bands).
  const edgePaddingS = defaultEdgePaddingS(narrowOptions);
  const narrow = workspace.narrowCopyFor(samples.length);
  narrow.set(
    narrowBandAnalytic(samples, { ...narrowOptions, edgePaddingS }, workspace.transform).re,
  );
  const broad = narrowBandAnalytic(
    samples,
    { ...narrowOptions, bandHz: CYCLE_BROADBAND_HZ, edgePaddingS },
    workspace.transform,
  ).re;
  const cycles = findCycles(narrow, broad, fs);
  return { cycles, burst: detectBursts(cycles, options.thresholds ?? DEFAULT_BURST_THRESHOLDS) };
}

/** The cycle-by-cycle frequencies of `options.trials` of one channel. */
export function channelCycleTrials(
  samples: Float32Array | Float64Array,
  options: ChannelCycleOptions,
  workspace: CycleWorkspace = new CycleWorkspace(),
): ChannelCycleTrials {
  const { cycles, burst } = cyclesOfChannel(samples, options, workspace);
  const trialCount = options.onsetsS.length;
  const result: ChannelCycleTrials = {
    baselineHz: new Float64Array(trialCount).fill(NaN),
    postHz: new Float64Array(trialCount).fill(NaN),
    cycles: new Int32Array(trialCount),
    burstCycles: new Int32Array(trialCount),
  };
  const windowMean = (trial: number, [from, to]: readonly [number, number]): number => {
    const onset = options.onsetsS[trial];
    let sum = 0;
    let inBurst = 0;
    const first = lowerBound(cycles.centreS, onset + from);
    const end = lowerBound(cycles.centreS, onset + to);
    for (let c = first; c < end; c++) {
      if (burst[c]) {
        sum += 1 / cycles.periodS[c];
        inBurst++;
      }
    }
    result.cycles[trial] += end - first;
    result.burstCycles[trial] += inBurst;
    return inBurst > 0 ? sum / inBurst : NaN;
  };
  for (const trial of options.trials) {
    result.baselineHz[trial] = windowMean(trial, options.baselineWindowS);
    result.postHz[trial] = windowMean(trial, options.postWindowS);
  }
  return result;
}
