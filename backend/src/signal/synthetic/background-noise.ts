import type { SeededRandom } from '../random/random';

export interface PinkNoiseOptions {
  sampleRateHz: number;
  /** Root-mean-square of the whole series, in µV. */
  rmsUv: number;
  /** Lowest corner frequency of the sum; below it the spectrum flattens. Default 0.3 Hz. */
  lowestCornerHz?: number;
}

/** Ratio between neighbouring corner frequencies: three per decade keeps the 1/f ripple small. */
const CORNER_RATIO = 2.5;

/**
 * Adds a 1/f ("pink") background to `out` in place.
 *
 * A sum of first-order low-pass filtered white noises with corners spaced evenly on a
 * log axis and equal variance: each contributes a Lorentzian σ²·(2/π f_c)/(1 + (f/f_c)²),
 * and the sum falls as 1/f between the lowest corner and the Nyquist frequency
 * (common practice). Each stage starts in its stationary state, so there is no
 * start-up transient.
 */
export function addPinkNoise(
  out: Float64Array,
  rng: SeededRandom,
  options: PinkNoiseOptions,
): void {
  const nyquistHz = options.sampleRateHz / 2;
  const corners: number[] = [];
  for (let fc = options.lowestCornerHz ?? 0.3; fc < nyquistHz; fc *= CORNER_RATIO) corners.push(fc);
  // Equal stationary variance per stage, scaled so the sum has the asked-for RMS.
  const stageSd = options.rmsUv / Math.sqrt(corners.length);
  for (const cornerHz of corners) {
    const pole = Math.exp((-2 * Math.PI * cornerHz) / options.sampleRateHz);
    const drive = stageSd * Math.sqrt(1 - pole * pole);
    let state = stageSd * rng.normal();
    for (let n = 0; n < out.length; n++) {
      state = pole * state + drive * rng.normal();
      out[n] += state;
    }
  }
}

export interface SlowNoiseOptions {
  sampleRateHz: number;
  /** Time constant of the first-order low-pass, in s. */
  timeConstantS: number;
}

/**
 * Zero-mean, unit-variance slowly varying noise (a stationary first-order autoregressive
 * process; common practice), written into `out`. Used for the alpha rhythm's waxing and
 * waning and for its small frequency wander.
 */
export function fillSlowNoise(
  out: Float64Array,
  rng: SeededRandom,
  options: SlowNoiseOptions,
): void {
  const pole = Math.exp(-1 / (options.timeConstantS * options.sampleRateHz));
  const drive = Math.sqrt(1 - pole * pole);
  let state = rng.normal();
  for (let n = 0; n < out.length; n++) {
    state = pole * state + drive * rng.normal();
    out[n] = state;
  }
}
