import { checkLength, ComplexDft, DftScratch } from './complex-dft';
import { fftPlan, FftPlan, isPowerOfTwo, nextPowerOfTwo } from './fft-plan';
import { MixedRadixFftPlan, radixFactors } from './mixed-radix-fft';

/** A power-of-two length: fft.js's radix-4 transform, no work buffers. */
class PowerOfTwoDft implements ComplexDft {
  readonly size: number;
  private readonly plan: FftPlan;

  constructor(size: number) {
    this.size = size;
    this.plan = fftPlan(size);
  }

  createScratch(): DftScratch {
    return { a: new Float64Array(0), b: new Float64Array(0) };
  }

  forward(input: Float64Array, output: Float64Array): void {
    this.plan.forward(input, output);
  }
}

/**
 * A forward DFT of a length with a large prime factor, by Bluestein's chirp-z identity
 * nk = (n² + k² − (k − n)²)/2, which turns the DFT into a circular convolution of
 * power-of-two length M ≥ 2n − 1 (a standard FFT technique; common practice). It costs
 * three FFTs of M, so `dftPlan` uses it only where the mixed-radix plan cannot go.
 */
export class BluesteinDft implements ComplexDft {
  readonly size: number;
  private readonly inner: FftPlan;
  /** Chirp w[k] = e^(−iπk²/n), interleaved. */
  private readonly chirp: Float64Array;
  /** DFT of the convolution kernel conj(w) wrapped to length M, interleaved. */
  private readonly kernelSpectrum: Float64Array;

  constructor(size: number) {
    if (!Number.isInteger(size) || size < 1) {
      throw new RangeError(`DFT size: expected a positive integer, got ${size}`);
    }
    this.size = size;
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
    const m = this.inner.size;
    return { a: new Float64Array(2 * m), b: new Float64Array(2 * m) };
  }

  /** Forward complex DFT of interleaved `input` (length 2n) into `output` (length 2n). */
  forward(input: Float64Array, output: Float64Array, scratch: DftScratch): void {
    const n = this.size;
    checkLength(input, 2 * n, 'input');
    checkLength(output, 2 * n, 'output');
    const inner = this.inner;
    const m = inner.size;
    const { a, b } = scratch;
    checkLength(a, 2 * m, 'scratch');
    checkLength(b, 2 * m, 'scratch');
    a.fill(0);
    multiplyInto(a, input, this.chirp, n);
    inner.forward(a, b);
    multiplyInto(b, b, this.kernelSpectrum, m);
    inner.inverse(b, a);
    multiplyInto(output, a, this.chirp, n);
  }
}

/** out[k] = x[k]·w[k] for the first `count` interleaved complex values (out may be x). */
function multiplyInto(out: Float64Array, x: Float64Array, w: Float64Array, count: number): void {
  for (let k = 0; k < count; k++) {
    const xr = x[2 * k];
    const xi = x[2 * k + 1];
    const wr = w[2 * k];
    const wi = w[2 * k + 1];
    out[2 * k] = xr * wr - xi * wi;
    out[2 * k + 1] = xr * wi + xi * wr;
  }
}

const dftPlans = new Map<number, ComplexDft>();

/**
 * The cached forward DFT plan for any length: fft.js for powers of two, the mixed-radix
 * plan when every prime factor is small (Welch's 1000 and 2000 samples are 2^a·5^3),
 * Bluestein otherwise.
 */
export function dftPlan(size: number): ComplexDft {
  let plan = dftPlans.get(size);
  if (!plan) {
    if (isPowerOfTwo(size)) plan = new PowerOfTwoDft(size);
    else if (radixFactors(size) !== null) plan = new MixedRadixFftPlan(size);
    else plan = new BluesteinDft(size);
    dftPlans.set(size, plan);
  }
  return plan;
}
