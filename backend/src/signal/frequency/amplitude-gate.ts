/**
 * The amplitude gate (docs/method.md, "Amplitude gate"): instantaneous frequency where the
 * narrow-band envelope is weak is mostly phase noise, so values whose analytic amplitude is
 * under a percentile of the channel's own envelope are left out ("no value", NaN) before
 * the running median and the epoch means.
 */
import { quantileSorted } from '../trials/onset-statistics';
import type { ComplexSeries } from './analytic-signal';

/** Samples one channel's gate left out. */
export interface AmplitudeGateCount {
  /** The envelope percentile under which values were left out. */
  percentile: number;
  excludedSamples: number;
  totalSamples: number;
}

/**
 * Envelope of each frequency value: value k lies between samples k and k+1 (Boashash 1992),
 * so its envelope is the mean of |z[k]| and |z[k+1]|. N−1 values into `output`.
 */
export function midpointEnvelope(z: ComplexSeries, output: Float64Array): Float64Array {
  const n = z.re.length - 1;
  if (output.length !== n) {
    throw new RangeError(`output: expected length ${n}, got ${output.length}`);
  }
  let previous = Math.hypot(z.re[0], z.im[0]);
  for (let k = 0; k < n; k++) {
    const next = Math.hypot(z.re[k + 1], z.im[k + 1]);
    output[k] = (previous + next) / 2;
    previous = next;
  }
  return output;
}

/**
 * The `percentile` (0…100) of `values` as `numpy.percentile` computes it by default
 * (linear interpolation between the two nearest ranks). Sorts `scratch`, a buffer of at
 * least `values.length`.
 */
export function percentileOf(
  values: Float64Array,
  percentile: number,
  scratch: Float64Array = new Float64Array(values.length),
): number {
  if (!(percentile >= 0 && percentile <= 100)) {
    throw new RangeError(`percentile: expected 0 to 100, got ${percentile}`);
  }
  if (values.length === 0) return NaN;
  const sorted = scratch.subarray(0, values.length);
  sorted.set(values);
  sorted.sort();
  return quantileSorted(sorted, percentile / 100);
}

/**
 * Sets `frequencyHz[k]` to NaN where `envelope[k]` is under the `percentile` of the
 * envelope, and counts them. `scratch` is sorted in place (see `percentileOf`).
 */
export function gateByAmplitude(
  frequencyHz: Float64Array,
  envelope: Float64Array,
  percentile: number,
  scratch?: Float64Array,
): AmplitudeGateCount {
  if (envelope.length !== frequencyHz.length) {
    throw new RangeError(`envelope: expected length ${frequencyHz.length}, got ${envelope.length}`);
  }
  const threshold = percentileOf(envelope, percentile, scratch);
  let excluded = 0;
  for (let k = 0; k < envelope.length; k++) {
    if (envelope[k] < threshold) {
      frequencyHz[k] = NaN;
      excluded++;
    }
  }
  return { percentile, excludedSamples: excluded, totalSamples: envelope.length };
}
