import { isPowerOfTwo } from '../fft/fft-plan';
import { mixedRadixLength, mixedRadixPlan, MixedRadixScratch } from '../fft/mixed-radix-fft';
import { SpectralWeight } from './spectral-weights';

/** A complex time series as two parallel arrays (transferable to a worker thread). */
export interface ComplexSeries {
  re: Float64Array;
  im: Float64Array;
}

export interface AnalyticSignalOptions {
  sampleRateHz: number;
  /** Zero-phase response multiplied into the spectrum; null gives the plain analytic signal. */
  weight: SpectralWeight | null;
  /**
   * Samples mirrored onto each end before the transform (default 0). Mirroring keeps
   * the jump between the two ends of the circular transform away from the data.
   */
  edgePaddingSamples?: number;
  /**
   * Use exactly N points, no padding (N must be a power of two): the circular
   * N-point transform of Marple 1999, as `scipy.signal.hilbert` computes it.
   */
  circular?: boolean;
}

/**
 * Buffers for one analytic-signal call; reuse it for many channels of one call, but
 * never share it between concurrent calls.
 */
export class AnalyticWorkspace {
  readonly size: number;
  readonly real: Float64Array;
  readonly spectrum: Float64Array;
  readonly shaped: Float64Array;
  /** Bins of `shaped` that the last call wrote (all others are zero). */
  shapedFirstBin = 0;
  shapedLastBin = 0;

  readonly scratch: MixedRadixScratch;

  constructor(size: number) {
    if (mixedRadixLength(size) !== size) {
      throw new RangeError(`workspace size: expected a length p·2^a (p = 1, 3, 5, 7), got ${size}`);
    }
    this.size = size;
    this.scratch = mixedRadixPlan(size).createScratch();
    this.real = new Float64Array(size);
    this.spectrum = new Float64Array(2 * size);
    this.shaped = new Float64Array(2 * size);
  }
}

/**
 * FFT length used for `n` samples with `padding` mirrored samples on each side: the
 * shortest p·2^a (p = 1, 3, 5, 7) that holds them, or exactly n for the circular form.
 */
export function analyticFftSize(n: number, padding: number, circular: boolean): number {
  if (circular) {
    if (!isPowerOfTwo(n)) {
      throw new RangeError(`circular analytic signal: length must be a power of two, got ${n}`);
    }
    return n;
  }
  return mixedRadixLength(n + 2 * padding);
}

/**
 * Analytic signal z[n] of the (optionally band-limited) input in one spectral
 * multiplication: one forward and one inverse FFT (Marple 1999, "Computing the
 * discrete-time analytic signal via FFT", IEEE Trans. Signal Process. 47:2600–2603).
 * With spectrum X[k] of length M (even) and weight G:
 *   Z[0] = G(0)·X[0], Z[M/2] = G(fs/2)·X[M/2], Z[k] = 2·G(k·fs/M)·X[k] for 0 < k < M/2,
 *   Z[k] = 0 for M/2 < k < M, and z = IDFT(Z).
 * Re z is the zero-phase filtered signal, Im z its Hilbert transform.
 */
export function analyticSignal(
  samples: Float32Array | Float64Array,
  options: AnalyticSignalOptions,
  workspace?: AnalyticWorkspace,
): ComplexSeries {
  const n = samples.length;
  if (n < 2) throw new RangeError(`samples: expected at least 2 samples, got ${n}`);
  const fs = options.sampleRateHz;
  if (!(fs > 0)) throw new RangeError(`sampleRateHz: expected a positive rate, got ${fs}`);
  const circular = options.circular ?? false;
  const padding = circular ? 0 : Math.min(options.edgePaddingSamples ?? 0, n - 1);
  if (!Number.isInteger(padding) || padding < 0) {
    throw new RangeError(`edgePaddingSamples: expected a non-negative integer, got ${padding}`);
  }
  const m = analyticFftSize(n, padding, circular);
  const ws = workspace && workspace.size === m ? workspace : new AnalyticWorkspace(m);
  const { real, spectrum, shaped } = ws;

  // Mirror about the end samples, x[-j] = x[j]: no jump in value at the edges, and an
  // outlying end sample is not amplified (as an odd reflection 2·x[0] − x[j] would).
  for (let j = 1; j <= padding; j++) real[padding - j] = samples[j];
  for (let i = 0; i < n; i++) real[padding + i] = samples[i];
  for (let j = 1; j <= padding; j++) real[padding + n - 1 + j] = samples[n - 1 - j];
  real.fill(0, n + 2 * padding);

  const plan = mixedRadixPlan(m);
  plan.forwardReal(real, spectrum, ws.scratch);

  const half = m / 2;
  const binHz = fs / m;
  // Only the bins written last time can be non-zero: clear just those.
  shaped.fill(0, 2 * ws.shapedFirstBin, 2 * ws.shapedLastBin + 2);
  const weight = options.weight;
  const first = weight === null ? 0 : Math.max(0, Math.ceil(weight.supportHz[0] / binHz));
  const last = weight === null ? half : Math.min(half, Math.floor(weight.supportHz[1] / binHz));
  ws.shapedFirstBin = first;
  ws.shapedLastBin = Math.max(first, last);
  // The inverse DFT is computed as conj(DFT(conj Z))/M: the conjugate is written here and
  // the scaling is folded into the copy-out, which saves a pass over 2·M values.
  for (let k = first; k <= last; k++) {
    const g = (weight === null ? 1 : weight.weightAt(k * binHz)) * (k === 0 || k === half ? 1 : 2);
    shaped[2 * k] = g * spectrum[2 * k];
    shaped[2 * k + 1] = -g * spectrum[2 * k + 1];
  }
  // The transform goes into `spectrum`, which is no longer needed.
  plan.forward(shaped, spectrum, ws.scratch);

  const re = new Float64Array(n);
  const im = new Float64Array(n);
  const scale = 1 / m;
  for (let i = 0, j = 2 * padding; i < n; i++, j += 2) {
    re[i] = spectrum[j] * scale;
    im[i] = -spectrum[j + 1] * scale;
  }
  return { re, im };
}

/** Envelope |z[n]| of a complex series. */
export function envelope(z: ComplexSeries): Float64Array {
  const out = new Float64Array(z.re.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.hypot(z.re[i], z.im[i]);
  return out;
}
