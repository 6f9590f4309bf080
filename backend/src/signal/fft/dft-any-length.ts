import { fftPlan, FftPlan, isPowerOfTwo, nextPowerOfTwo } from './fft-plan';

/** Scratch buffers of one DFT call; create one per call site, never share between threads. */
export interface DftScratch {
  a: Float64Array;
  b: Float64Array;
}

/**
 * A forward DFT of any length n. Powers of two go straight to fft.js; other lengths
 * use Bluestein's chirp-z identity nk = (n² + k² − (k − n)²)/2, which turns the DFT
 * into a circular convolution of power-of-two length M ≥ 2n − 1 (a standard FFT
 * technique; common practice).
 * Welch's 4 s segments are 1000 or 2000 samples long, not powers of two.
 */
export class DftPlan {
  readonly size: number;
  private readonly direct: FftPlan | null;
  private readonly inner: FftPlan | null;
  /** Chirp w[k] = e^(−iπk²/n), interleaved. */
  private readonly chirp: Float64Array;
  /** DFT of the convolution kernel conj(w) wrapped to length M, interleaved. */
  private readonly kernelSpectrum: Float64Array;

  constructor(size: number) {
    if (!Number.isInteger(size) || size < 1) {
      throw new RangeError(`DFT size: expected a positive integer, got ${size}`);
    }
    this.size = size;
    if (isPowerOfTwo(size)) {
      this.direct = fftPlan(size);
      this.inner = null;
      this.chirp = new Float64Array(0);
      this.kernelSpectrum = new Float64Array(0);
      return;
    }
    this.direct = null;
    const m = nextPowerOfTwo(2 * size - 1);
    const inner = fftPlan(m);
    this.inner = inner;
    const chirp = new Float64Array(2 * size);
    const twoN = 2 * size;
    for (let k = 0; k < size; k++) {
      // k² mod 2n keeps the angle small and exact for large k.
      const k2 = (k * k) % twoN;
      const angle = (Math.PI * k2) / size;
      chirp[2 * k] = Math.cos(angle);
      chirp[2 * k + 1] = -Math.sin(angle);
    }
    this.chirp = chirp;
    const kernel = new Float64Array(2 * m);
    for (let k = 0; k < size; k++) {
      kernel[2 * k] = chirp[2 * k];
      kernel[2 * k + 1] = -chirp[2 * k + 1];
      if (k > 0) {
        kernel[2 * (m - k)] = chirp[2 * k];
        kernel[2 * (m - k) + 1] = -chirp[2 * k + 1];
      }
    }
    this.kernelSpectrum = new Float64Array(2 * m);
    inner.forward(kernel, this.kernelSpectrum);
  }

  createScratch(): DftScratch {
    const m = this.inner ? this.inner.size : this.size;
    return { a: new Float64Array(2 * m), b: new Float64Array(2 * m) };
  }

  /** Forward complex DFT of interleaved `input` (length 2n) into `output` (length 2n). */
  forward(input: Float64Array, output: Float64Array, scratch: DftScratch): void {
    const n = this.size;
    if (input.length !== 2 * n || output.length !== 2 * n) {
      throw new RangeError(
        `DFT buffers: expected length ${2 * n}, got ${input.length} and ${output.length}`,
      );
    }
    if (this.direct) {
      this.direct.forward(input, output);
      return;
    }
    const inner = this.inner as FftPlan;
    const m = inner.size;
    const { a, b } = scratch;
    const w = this.chirp;
    a.fill(0);
    for (let k = 0; k < n; k++) {
      const xr = input[2 * k];
      const xi = input[2 * k + 1];
      const wr = w[2 * k];
      const wi = w[2 * k + 1];
      a[2 * k] = xr * wr - xi * wi;
      a[2 * k + 1] = xr * wi + xi * wr;
    }
    inner.forward(a, b);
    const h = this.kernelSpectrum;
    for (let k = 0; k < m; k++) {
      const br = b[2 * k];
      const bi = b[2 * k + 1];
      const hr = h[2 * k];
      const hi = h[2 * k + 1];
      b[2 * k] = br * hr - bi * hi;
      b[2 * k + 1] = br * hi + bi * hr;
    }
    inner.inverse(b, a);
    for (let k = 0; k < n; k++) {
      const cr = a[2 * k];
      const ci = a[2 * k + 1];
      const wr = w[2 * k];
      const wi = w[2 * k + 1];
      output[2 * k] = cr * wr - ci * wi;
      output[2 * k + 1] = cr * wi + ci * wr;
    }
  }
}

const dftPlans = new Map<number, DftPlan>();

/** The cached any-length plan for `size`. */
export function dftPlan(size: number): DftPlan {
  let plan = dftPlans.get(size);
  if (!plan) {
    plan = new DftPlan(size);
    dftPlans.set(size, plan);
  }
  return plan;
}
