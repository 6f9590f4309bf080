import FFT from 'fft.js';

/** Smallest power of two ≥ `n` (and ≥ 2, the smallest size fft.js accepts). */
export function nextPowerOfTwo(n: number): number {
  if (!Number.isFinite(n) || n < 0) {
    throw new RangeError(`FFT length: expected a non-negative finite number, got ${n}`);
  }
  let size = 2;
  while (size < n) size *= 2;
  return size;
}

export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;
}

/**
 * A radix-4 FFT of one power-of-two size (fft.js by F. Indutny). Complex arrays are
 * interleaved `[re0, im0, re1, im1, …]` of length 2·size, owned by the caller.
 *
 * The wrapped fft.js object keeps only precomputed twiddle and bit-reversal tables
 * plus two references it sets and clears inside each synchronous call, so one plan
 * can serve many calls (and the cache below is per worker thread, never shared).
 */
export class FftPlan {
  readonly size: number;
  private readonly engine: FFT;

  constructor(size: number) {
    if (!isPowerOfTwo(size)) {
      throw new RangeError(`FFT size: expected a power of two ≥ 2, got ${size}`);
    }
    this.size = size;
    this.engine = new FFT(size);
  }

  /**
   * Forward DFT X[k] = Σ x[n]·e^(−2πikn/N) of a real input (length size). Writes bins
   * 0..size/2 into `spectrum` (interleaved, length 2·size); the upper half is left as is.
   */
  forwardReal(input: Float64Array, spectrum: Float64Array): void {
    this.check(input, this.size, 'input');
    this.check(spectrum, 2 * this.size, 'spectrum');
    this.engine.realTransform(spectrum, input);
  }

  /** Forward complex DFT, interleaved input and output of length 2·size (distinct buffers). */
  forward(input: Float64Array, output: Float64Array): void {
    this.check(input, 2 * this.size, 'input');
    this.check(output, 2 * this.size, 'output');
    this.engine.transform(output, input);
  }

  /** Inverse complex DFT x[n] = (1/N) Σ X[k]·e^(+2πikn/N) (distinct buffers). */
  inverse(input: Float64Array, output: Float64Array): void {
    this.check(input, 2 * this.size, 'input');
    this.check(output, 2 * this.size, 'output');
    this.engine.inverseTransform(output, input);
  }

  private check(buffer: Float64Array, expected: number, name: string): void {
    if (buffer.length !== expected) {
      throw new RangeError(`FFT ${name}: expected length ${expected}, got ${buffer.length}`);
    }
  }
}

const plans = new Map<number, FftPlan>();

/** The cached plan for `size` (tables are immutable, so sharing them is safe). */
export function fftPlan(size: number): FftPlan {
  let plan = plans.get(size);
  if (!plan) {
    plan = new FftPlan(size);
    plans.set(size, plan);
  }
  return plan;
}
