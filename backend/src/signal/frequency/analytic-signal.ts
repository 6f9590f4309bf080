import { isPowerOfTwo } from '../fft/fft-plan';
import { BandDftPlan, BandDftScratch, bandSubSize, PhaseSink, PhaseSource } from '../fft/band-dft';
import { mixedRadixLength } from '../fft/mixed-radix-fft';
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
  /** Spectrum bins of the weight's support, interleaved. */
  band = new Float64Array(0);
  readonly scratch = new BandDftScratch();

  constructor(size: number) {
    if (mixedRadixLength(size) !== size) {
      throw new RangeError(`workspace size: expected a length p·2^a (p = 1, 3, 5, 7), got ${size}`);
    }
    this.size = size;
  }

  bandFor(count: number): Float64Array {
    if (this.band.length < 2 * count) this.band = new Float64Array(2 * count);
    return this.band;
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
 * Only the bins inside the weight's support are non-zero, so both transforms run as
 * `BandDftPlan`: the same M-point DFT, computed as short cache-sized transforms and
 * pruned to the band (results equal to rounding). Writes into `output` when given.
 */
export function analyticSignal(
  samples: Float32Array | Float64Array,
  options: AnalyticSignalOptions,
  workspace?: AnalyticWorkspace,
  output?: ComplexSeries,
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
  const re = output?.re ?? new Float64Array(n);
  const im = output?.im ?? new Float64Array(n);
  if (re.length !== n || im.length !== n) {
    throw new RangeError(
      `output: expected re and im of length ${n}, got ${re.length}, ${im.length}`,
    );
  }

  const half = m / 2;
  const binHz = fs / m;
  const weight = options.weight;
  const first = weight === null ? 0 : Math.max(0, Math.ceil(weight.supportHz[0] / binHz));
  const last = weight === null ? half : Math.min(half, Math.floor(weight.supportHz[1] / binHz));
  if (last < first) {
    // The weight's support holds no bin: the filtered signal is zero.
    re.fill(0);
    im.fill(0);
    return { re, im };
  }
  const count = last - first + 1;
  const plan = new BandDftPlan(m, bandSubSize(m, first, last));
  const d = plan.decimation;
  const l = plan.subSize;
  const band = ws.bandFor(count);

  const input = new MirroredInput(samples, padding, d, l);
  plan.forwardRealBand(input, first, last, band, ws.scratch);

  // Z[k] = g·X[k] with g = G(k·fs/M), doubled for 0 < k < M/2 (Marple 1999); stored
  // conjugated for the inverse by forward short transforms.
  for (let i = 0; i < count; i++) {
    const k = first + i;
    const g = (weight === null ? 1 : weight.weightAt(k * binHz)) * (k === 0 || k === half ? 1 : 2);
    band[2 * i] *= g;
    band[2 * i + 1] *= -g;
  }
  const sink = new PaddedOutput(re, im, padding, d, l, 1 / m);
  plan.inverseBand(band, first, last, sink, ws.scratch);
  return { re, im };
}

/**
 * The input mirrored about its end samples, x[-j] = x[j]: no jump in value at the
 * edges, and an outlying end sample is not amplified (as an odd reflection 2·x[0] − x[j]
 * would); zero after the mirrored tail. Read straight from the samples, phase by phase.
 */
class MirroredInput implements PhaseSource {
  private readonly n: number;

  constructor(
    private readonly samples: Float32Array | Float64Array,
    private readonly padding: number,
    private readonly decimation: number,
    private readonly subSize: number,
  ) {
    this.n = samples.length;
  }

  private at(t: number): number {
    const { samples, padding, n } = this;
    if (t < padding) return samples[padding - t];
    if (t < padding + n) return samples[t - padding];
    if (t < n + 2 * padding) return samples[2 * n - 2 + padding - t];
    return 0;
  }

  readPhases(firstPhase: number, out: readonly Float64Array[]): void {
    const { samples, padding, n, decimation, subSize } = this;
    const g = out.length;
    for (let u = 0, base = firstPhase; u < subSize; u++, base += decimation) {
      if (base >= padding && base + g <= padding + n) {
        const s0 = base - padding;
        for (let j = 0; j < g; j++) out[j][u] = samples[s0 + j];
      } else {
        for (let j = 0; j < g; j++) out[j][u] = this.at(base + j);
      }
    }
  }
}

/** Keeps z[t] for the samples inside the padding: re z = y·scale, im z = −y·scale. */
class PaddedOutput implements PhaseSink {
  constructor(
    private readonly re: Float64Array,
    private readonly im: Float64Array,
    private readonly padding: number,
    private readonly decimation: number,
    private readonly subSize: number,
    private readonly scale: number,
  ) {}

  takePhases(firstPhase: number, y: readonly Float64Array[]): void {
    const { re, im, padding, decimation, subSize, scale } = this;
    const n = re.length;
    const g = y.length;
    for (let u = 0, base = firstPhase; u < subSize; u++, base += decimation) {
      if (base >= padding && base + g <= padding + n) {
        const i0 = base - padding;
        for (let j = 0; j < g; j++) {
          re[i0 + j] = y[j][2 * u] * scale;
          im[i0 + j] = -y[j][2 * u + 1] * scale;
        }
      } else {
        for (let j = 0; j < g; j++) {
          const i = base + j - padding;
          if (i < 0 || i >= n) continue;
          re[i] = y[j][2 * u] * scale;
          im[i] = -y[j][2 * u + 1] * scale;
        }
      }
    }
  }
}

/** Envelope |z[n]| of a complex series. */
export function envelope(z: ComplexSeries): Float64Array {
  const out = new Float64Array(z.re.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.hypot(z.re[i], z.im[i]);
  return out;
}
