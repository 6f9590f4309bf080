import {
  BOOTSTRAP_RESAMPLES,
  BOOTSTRAP_SEED,
  DEFAULT_ANALYSIS_SETTINGS,
} from '../pipeline/analysis-settings';
import { seededUniform } from '../random/random';
import { wilcoxonSignedRank, WilcoxonMethod } from './wilcoxon';

export interface BootstrapOptions {
  /** Resamples (default `BOOTSTRAP_RESAMPLES`, docs/method.md §3). */
  resamples?: number;
  /**
   * Seed of the generator (default `BOOTSTRAP_SEED`): every caller that leaves it out gets
   * the same interval as the server for the same trials.
   */
  seed?: number;
  /** Coverage (default 0.95). */
  level?: number;
}

/**
 * Percentile bootstrap interval of the mean (Efron & Tibshirani 1993, "An Introduction
 * to the Bootstrap", ch. 13): resample the values with replacement, take each mean,
 * and read the (1−level)/2 and (1+level)/2 quantiles of the sorted means (linear
 * interpolation between order statistics, as numpy.quantile's default).
 */
export function bootstrapMeanInterval(
  values: ArrayLike<number>,
  options: BootstrapOptions = {},
): [number, number] | null {
  const n = values.length;
  if (n === 0) return null;
  const resamples = options.resamples ?? BOOTSTRAP_RESAMPLES;
  const level = options.level ?? 0.95;
  const random = seededUniform(options.seed ?? BOOTSTRAP_SEED);
  const means = new Float64Array(resamples);
  for (let r = 0; r < resamples; r++) {
    let sum = 0;
    for (let i = 0; i < n; i++) sum += values[Math.floor(random() * n)];
    means[r] = sum / n;
  }
  means.sort();
  return [quantileSorted(means, (1 - level) / 2), quantileSorted(means, (1 + level) / 2)];
}

/** Quantile of sorted values with linear interpolation (numpy.quantile 'linear'). */
export function quantileSorted(sorted: Float64Array, q: number): number {
  const position = q * (sorted.length - 1);
  const below = Math.floor(position);
  const above = Math.min(sorted.length - 1, below + 1);
  const weight = position - below;
  return sorted[below] + (sorted[above] - sorted[below]) * weight;
}

export interface OnsetStatisticsOptions extends BootstrapOptions {
  /** Δf at or below which Gyre suggests a slowing flag (a study setting; default Gyre's −0.2 Hz). */
  flagThresholdHz?: number;
}

export interface OnsetStatistics {
  /** Mean frequency in the baseline window over trials, Hz. */
  baselineHz: number | null;
  /** Mean frequency in the post window over trials, Hz. */
  postHz: number | null;
  /** Mean of post − baseline over trials, Hz (negative = slowing). */
  deltaFHz: number | null;
  /** Bootstrap 95 % interval of the mean Δf, Hz. */
  ciHz: [number, number] | null;
  /** Two-sided Wilcoxon signed-rank p of the trial Δf values. */
  pValue: number | null;
  wilcoxonMethod: WilcoxonMethod | null;
  /** Δf ≤ threshold and the interval excludes 0: Gyre suggests, an analyst decides. */
  suggestsSlowing: boolean;
}

/**
 * Baseline, post and Δf over trials (docs/method.md §3), with the bootstrap interval of
 * the mean Δf (Efron & Tibshirani 1993) and the Wilcoxon signed-rank test.
 */
export function onsetStatistics(
  baselineHz: ArrayLike<number>,
  postHz: ArrayLike<number>,
  options: OnsetStatisticsOptions = {},
): OnsetStatistics {
  const n = baselineHz.length;
  if (postHz.length !== n) {
    throw new RangeError(`postHz: expected ${n} trials like baselineHz, got ${postHz.length}`);
  }
  if (n === 0) {
    return {
      baselineHz: null,
      postHz: null,
      deltaFHz: null,
      ciHz: null,
      pValue: null,
      wilcoxonMethod: null,
      suggestsSlowing: false,
    };
  }
  const delta = new Float64Array(n);
  let sumBase = 0;
  let sumPost = 0;
  for (let i = 0; i < n; i++) {
    delta[i] = postHz[i] - baselineHz[i];
    sumBase += baselineHz[i];
    sumPost += postHz[i];
  }
  let sumDelta = 0;
  for (let i = 0; i < n; i++) sumDelta += delta[i];
  const deltaFHz = sumDelta / n;
  const ciHz = bootstrapMeanInterval(delta, options);
  const test = wilcoxonSignedRank(delta);
  const threshold = options.flagThresholdHz ?? DEFAULT_ANALYSIS_SETTINGS.flagThresholdHz;
  return {
    baselineHz: sumBase / n,
    postHz: sumPost / n,
    deltaFHz,
    ciHz,
    pValue: Number.isNaN(test.pValue) ? null : test.pValue,
    wilcoxonMethod: Number.isNaN(test.pValue) ? null : test.method,
    suggestsSlowing: deltaFHz <= threshold && ciHz !== null && ciHz[1] < 0,
  };
}

/** Mean of each trial's values in the point range [start, end) of its epoch. */
export function trialWindowMeans(
  epochs: Float64Array,
  points: number,
  trials: readonly number[],
  range: readonly [number, number],
): Float64Array {
  const out = new Float64Array(trials.length);
  trials.forEach((trial, k) => {
    let sum = 0;
    let count = 0;
    for (let i = range[0]; i < range[1]; i++) {
      const v = epochs[trial * points + i];
      if (!Number.isNaN(v)) {
        sum += v;
        count++;
      }
    }
    out[k] = count > 0 ? sum / count : NaN;
  });
  return out;
}

export interface OnsetCurve {
  /** Time of each point relative to onset, s. */
  timesS: Float64Array;
  /** Mean frequency over trials, Hz. */
  meanHz: Float64Array;
  /** Pointwise 95 % band: mean ∓ 1.96·SD/√n (normal approximation, common practice). */
  lowerHz: Float64Array;
  upperHz: Float64Array;
  /** Trials × points, row-major, Hz: each trial's frequency, binned like the curve. */
  raster: Float32Array;
  trialCount: number;
}

/**
 * Buffers `onsetCurve` reuses from call to call, so a channel loop does not touch fresh
 * memory (a page fault per 4 KiB) for every channel. One caller's; never shared between
 * concurrent calls.
 */
export class OnsetCurveScratch {
  private binned = new Float64Array(0);
  private raster = new Float32Array(0);

  binnedFor(length: number): Float64Array {
    if (this.binned.length < length) this.binned = new Float64Array(length);
    return this.binned.subarray(0, length);
  }

  rasterFor(length: number): Float32Array {
    if (this.raster.length < length) this.raster = new Float32Array(length);
    return this.raster.subarray(0, length);
  }
}

/**
 * Mean onset curve with a pointwise band and the trial raster, binned by averaging
 * consecutive points so that at most `maxPoints` remain (for display). With `scratch`,
 * the raster is a view of its buffer, overwritten by the next call with it.
 */
export function onsetCurve(
  epochs: Float64Array,
  options: {
    points: number;
    trials: readonly number[];
    epochWindowS: readonly [number, number];
    sampleRateHz: number;
    maxPoints?: number;
  },
  scratch?: OnsetCurveScratch,
): OnsetCurve {
  const { points, trials, sampleRateHz } = options;
  const maxPoints = options.maxPoints ?? 500;
  const factor = Math.max(1, Math.ceil(points / maxPoints));
  const bins = Math.ceil(points / factor);
  const n = trials.length;
  const raster = scratch ? scratch.rasterFor(n * bins) : new Float32Array(n * bins);
  const timesS = new Float64Array(bins);
  for (let b = 0; b < bins; b++) {
    const first = b * factor;
    const last = Math.min(points, first + factor);
    timesS[b] = options.epochWindowS[0] + (first + last - 1) / 2 / sampleRateHz;
  }
  const binned = scratch ? scratch.binnedFor(n * bins) : new Float64Array(n * bins);
  trials.forEach((trial, k) => {
    for (let b = 0; b < bins; b++) {
      const first = b * factor;
      const last = Math.min(points, first + factor);
      // NaN (no value: the amplitude gate) is left out; a bin of NaN only stays NaN.
      let sum = 0;
      let count = 0;
      for (let i = first; i < last; i++) {
        const v = epochs[trial * points + i];
        if (!Number.isNaN(v)) {
          sum += v;
          count++;
        }
      }
      binned[k * bins + b] = count > 0 ? sum / count : NaN;
      raster[k * bins + b] = binned[k * bins + b];
    }
  });
  const meanHz = new Float64Array(bins);
  const lowerHz = new Float64Array(bins);
  const upperHz = new Float64Array(bins);
  for (let b = 0; b < bins; b++) {
    let sum = 0;
    let count = 0;
    for (let k = 0; k < n; k++) {
      const v = binned[k * bins + b];
      if (!Number.isNaN(v)) {
        sum += v;
        count++;
      }
    }
    const mean = count > 0 ? sum / count : NaN;
    let ss = 0;
    for (let k = 0; k < n; k++) {
      const v = binned[k * bins + b];
      if (!Number.isNaN(v)) ss += (v - mean) ** 2;
    }
    const sem = count > 1 ? Math.sqrt(ss / (count - 1) / count) : NaN;
    meanHz[b] = mean;
    lowerHz[b] = mean - 1.96 * sem;
    upperHz[b] = mean + 1.96 * sem;
  }
  return { timesS, meanHz, lowerHz, upperHz, raster, trialCount: n };
}
