import { ComplexSeries } from './analytic-signal';

const TWO_PI = 2 * Math.PI;

/**
 * Instantaneous frequency f[n] = arg(z[n+1]·conj z[n])·fs/(2π) in Hz, N−1 values
 * (Boashash 1992, "Estimating and interpreting the instantaneous frequency of a
 * signal", Proc. IEEE 80:520–568). It equals the phase difference of the unwrapped
 * phase without unwrapping. Value n belongs between samples n and n+1: its time is
 * (n + 0.5)/fs (see `frequencyTimeS`). `output` may be a view of z.re from its start:
 * value k is written after re[k] and re[k + 1] are read.
 */
export function phaseDifferenceFrequency(
  z: ComplexSeries,
  options: { sampleRateHz: number },
  output?: Float64Array,
): Float64Array {
  const n = z.re.length;
  if (z.im.length !== n) {
    throw new RangeError(`complex series: re has ${n} values but im has ${z.im.length}`);
  }
  if (n < 2) throw new RangeError(`complex series: expected at least 2 samples, got ${n}`);
  const out = output ?? new Float64Array(n - 1);
  if (out.length !== n - 1) {
    throw new RangeError(`output: expected length ${n - 1}, got ${out.length}`);
  }
  const scale = options.sampleRateHz / TWO_PI;
  const { re, im } = z;
  let r0 = re[0];
  let i0 = im[0];
  for (let k = 0; k < n - 1; k++) {
    const r1 = re[k + 1];
    const i1 = im[k + 1];
    out[k] = Math.atan2(i1 * r0 - r1 * i0, r1 * r0 + i1 * i0) * scale;
    r0 = r1;
    i0 = i1;
  }
  return out;
}

/** Time in seconds (from the first sample) of frequency value `index`: a sample midpoint. */
export function frequencyTimeS(index: number, sampleRateHz: number): number {
  return (index + 0.5) / sampleRateHz;
}

/** Phase arg z[n] in (−π, π]. */
export function wrappedPhase(z: ComplexSeries): Float64Array {
  const out = new Float64Array(z.re.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.atan2(z.im[i], z.re[i]);
  return out;
}

/**
 * Unwrapped phase, as `numpy.unwrap` with its defaults (discont = π, period = 2π):
 * each jump is brought into [−π, π) by adding multiples of 2π, a jump of exactly
 * +π is kept as +π, and jumps smaller than π are left alone.
 */
export function unwrapPhase(phase: Float64Array): Float64Array {
  const n = phase.length;
  const out = new Float64Array(n);
  if (n === 0) return out;
  out[0] = phase[0];
  let correction = 0;
  for (let i = 1; i < n; i++) {
    const dd = phase[i] - phase[i - 1];
    // Floor-style modulo as numpy.mod computes it (fmod, then sign fix-up).
    let ddmod = (dd + Math.PI) % TWO_PI;
    if (ddmod !== 0 && ddmod < 0) ddmod += TWO_PI;
    ddmod -= Math.PI;
    if (ddmod === -Math.PI && dd > 0) ddmod = Math.PI;
    const step = Math.abs(dd) < Math.PI ? 0 : ddmod - dd;
    correction += step;
    out[i] = phase[i] + correction;
  }
  return out;
}

/** Frequency in Hz from an unwrapped phase: (φ[n+1] − φ[n])·fs/(2π) (Boashash 1992). */
export function frequencyFromPhase(unwrapped: Float64Array, sampleRateHz: number): Float64Array {
  const out = new Float64Array(Math.max(0, unwrapped.length - 1));
  const scale = sampleRateHz / TWO_PI;
  for (let i = 0; i < out.length; i++) out[i] = (unwrapped[i + 1] - unwrapped[i]) * scale;
  return out;
}
