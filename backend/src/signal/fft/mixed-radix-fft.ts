import { fftPlan, FftPlan, isPowerOfTwo } from './fft-plan';

/** Odd factors the mixed-radix plan accepts in front of a power of two. */
const ODD_FACTORS = [1, 3, 5, 7] as const;

/**
 * Smallest length ≥ n of the form p·2^a with p ∈ {1, 3, 5, 7} and 2^a ≥ 4: a length
 * close to n keeps zero padding (and so the transform cost) low, e.g. 5·2^16 = 327 680
 * for a 10-minute recording at 500 Hz instead of 2^19 = 524 288.
 */
export function mixedRadixLength(n: number): number {
  let best = Infinity;
  for (const p of ODD_FACTORS) {
    let size = 4;
    while (p * size < n) size *= 2;
    best = Math.min(best, p * size);
  }
  return best;
}

/** Scratch buffers of one mixed-radix call; owned by the caller, never shared between threads. */
export interface MixedRadixScratch {
  sub: Float64Array[];
  subSpectrum: Float64Array[];
  realSub: Float64Array;
}

/**
 * Forward DFT of length M = p·L (L a power of two) by one decimation-in-time step:
 * X[q + L·s] = Σ_r W_M^(r·q) · W_p^(r·s) · X_r[q], where X_r is the L-point DFT of
 * x[m·p + r] (the Cooley–Tukey factorisation, common practice). The L-point
 * transforms are fft.js's radix-4.
 */
export class MixedRadixFftPlan {
  readonly size: number;
  readonly factor: number;
  readonly subSize: number;
  private readonly sub: FftPlan;
  /** W_M^j = e^(−2πij/M), j < M, interleaved. */
  private readonly twiddle: Float64Array;
  /** W_p^j, j < p, interleaved. */
  private readonly root: Float64Array;

  constructor(size: number) {
    const factor = ODD_FACTORS.find(
      (p) => size % p === 0 && isPowerOfTwo(size / p) && size / p >= 4,
    );
    if (factor === undefined) {
      throw new RangeError(
        `mixed-radix FFT size: expected p·2^a with p in 1, 3, 5, 7, got ${size}`,
      );
    }
    this.size = size;
    this.factor = factor;
    this.subSize = size / factor;
    this.sub = fftPlan(this.subSize);
    this.twiddle = new Float64Array(factor === 1 ? 0 : 2 * size);
    if (factor > 1) {
      for (let j = 0; j < size; j++) {
        const angle = (-2 * Math.PI * j) / size;
        this.twiddle[2 * j] = Math.cos(angle);
        this.twiddle[2 * j + 1] = Math.sin(angle);
      }
    }
    this.root = new Float64Array(2 * factor);
    for (let j = 0; j < factor; j++) {
      const angle = (-2 * Math.PI * j) / factor;
      this.root[2 * j] = Math.cos(angle);
      this.root[2 * j + 1] = Math.sin(angle);
    }
  }

  createScratch(): MixedRadixScratch {
    const p = this.factor;
    const l = this.subSize;
    return {
      sub: Array.from({ length: p }, () => new Float64Array(2 * l)),
      subSpectrum: Array.from({ length: p }, () => new Float64Array(2 * l)),
      realSub: new Float64Array(l),
    };
  }

  /** Forward complex DFT, interleaved input and output of length 2·M (distinct buffers). */
  forward(input: Float64Array, output: Float64Array, scratch: MixedRadixScratch): void {
    this.checkLength(input, 2 * this.size, 'input');
    this.checkLength(output, 2 * this.size, 'output');
    if (this.factor === 1) {
      this.sub.forward(input, output);
      return;
    }
    const p = this.factor;
    const l = this.subSize;
    for (let r = 0; r < p; r++) {
      const sub = scratch.sub[r];
      for (let m = 0, j = 2 * r; m < l; m++, j += 2 * p) {
        sub[2 * m] = input[j];
        sub[2 * m + 1] = input[j + 1];
      }
      this.sub.forward(sub, scratch.subSpectrum[r]);
    }
    this.combine(scratch.subSpectrum, output, this.size);
  }

  /**
   * Forward DFT of a real input of length M; writes bins 0 … M/2 of `spectrum`
   * (interleaved, length 2·M). The L-point transforms use fft.js's real transform.
   */
  forwardReal(input: Float64Array, spectrum: Float64Array, scratch: MixedRadixScratch): void {
    this.checkLength(input, this.size, 'input');
    this.checkLength(spectrum, 2 * this.size, 'spectrum');
    if (this.factor === 1) {
      this.sub.forwardReal(input, spectrum);
      return;
    }
    const p = this.factor;
    const l = this.subSize;
    const realSub = scratch.realSub;
    for (let r = 0; r < p; r++) {
      for (let m = 0, j = r; m < l; m++, j += p) realSub[m] = input[j];
      const out = scratch.subSpectrum[r];
      this.sub.forwardReal(realSub, out);
      // Hermitian symmetry of a real input's DFT fills the upper half: X[L−q] = conj X[q].
      for (let q = 1; q < l / 2; q++) {
        out[2 * (l - q)] = out[2 * q];
        out[2 * (l - q) + 1] = -out[2 * q + 1];
      }
    }
    this.combine(scratch.subSpectrum, spectrum, this.size / 2 + 1);
  }

  /** Writes output bins k < `bins` from the p sub-spectra. */
  private combine(subSpectrum: Float64Array[], output: Float64Array, bins: number): void {
    const p = this.factor;
    const l = this.subSize;
    const w = this.twiddle;
    const root = this.root;
    const yr = new Float64Array(p);
    const yi = new Float64Array(p);
    for (let q = 0; q < l; q++) {
      for (let r = 0; r < p; r++) {
        const xr = subSpectrum[r][2 * q];
        const xi = subSpectrum[r][2 * q + 1];
        const t = 2 * r * q;
        const cr = w[t];
        const ci = w[t + 1];
        yr[r] = xr * cr - xi * ci;
        yi[r] = xr * ci + xi * cr;
      }
      for (let s = 0; s < p; s++) {
        const k = q + l * s;
        if (k >= bins) break;
        let sr = 0;
        let si = 0;
        for (let r = 0; r < p; r++) {
          const j = 2 * ((r * s) % p);
          const cr = root[j];
          const ci = root[j + 1];
          sr += yr[r] * cr - yi[r] * ci;
          si += yr[r] * ci + yi[r] * cr;
        }
        output[2 * k] = sr;
        output[2 * k + 1] = si;
      }
    }
  }

  private checkLength(buffer: Float64Array, expected: number, name: string): void {
    if (buffer.length !== expected) {
      throw new RangeError(`FFT ${name}: expected length ${expected}, got ${buffer.length}`);
    }
  }
}

const plans = new Map<number, MixedRadixFftPlan>();

/** The cached mixed-radix plan for `size` (tables are immutable). */
export function mixedRadixPlan(size: number): MixedRadixFftPlan {
  let plan = plans.get(size);
  if (!plan) {
    plan = new MixedRadixFftPlan(size);
    plans.set(size, plan);
  }
  return plan;
}
