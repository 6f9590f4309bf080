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
    if (this.factor === 3) this.combine3(subSpectrum, output, bins);
    else if (this.factor === 5) this.combine5(subSpectrum, output, bins);
    else this.combineAny(subSpectrum, output, bins);
  }

  /** Radix-3 butterfly: X_s = y0 + y1·W3^s + y2·W3^(2s), W3 = −½ − i·√3/2. */
  private combine3(sub: Float64Array[], out: Float64Array, bins: number): void {
    const l = this.subSize;
    const w = this.twiddle;
    const [x0, x1, x2] = sub;
    const h = Math.sqrt(3) / 2;
    for (let q = 0; q < l; q++) {
      const i = 2 * q;
      const y0r = x0[i];
      const y0i = x0[i + 1];
      let c = w[2 * q];
      let d = w[2 * q + 1];
      const y1r = x1[i] * c - x1[i + 1] * d;
      const y1i = x1[i] * d + x1[i + 1] * c;
      c = w[4 * q];
      d = w[4 * q + 1];
      const y2r = x2[i] * c - x2[i + 1] * d;
      const y2i = x2[i] * d + x2[i + 1] * c;
      const ar = y1r + y2r;
      const ai = y1i + y2i;
      const ur = h * (y1r - y2r);
      const ui = h * (y1i - y2i);
      const tr = y0r - 0.5 * ar;
      const ti = y0i - 0.5 * ai;
      put(out, bins, q, y0r + ar, y0i + ai);
      put(out, bins, q + l, tr + ui, ti - ur);
      put(out, bins, q + 2 * l, tr - ui, ti + ur);
    }
  }

  /**
   * Radix-5 butterfly with c_j = cos(2πj/5), s_j = sin(2πj/5): a1 = y1 + y4,
   * b1 = y1 − y4, a2 = y2 + y3, b2 = y2 − y3; X1,4 = y0 + c1·a1 + c2·a2 ∓ i(s1·b1 + s2·b2),
   * X2,3 = y0 + c2·a1 + c1·a2 ∓ i(s2·b1 − s1·b2).
   */
  private combine5(sub: Float64Array[], out: Float64Array, bins: number): void {
    const l = this.subSize;
    const w = this.twiddle;
    const [x0, x1, x2, x3, x4] = sub;
    const c1 = Math.cos((2 * Math.PI) / 5);
    const c2 = Math.cos((4 * Math.PI) / 5);
    const s1 = Math.sin((2 * Math.PI) / 5);
    const s2 = Math.sin((4 * Math.PI) / 5);
    for (let q = 0; q < l; q++) {
      const i = 2 * q;
      const y0r = x0[i];
      const y0i = x0[i + 1];
      let c = w[2 * q];
      let d = w[2 * q + 1];
      const y1r = x1[i] * c - x1[i + 1] * d;
      const y1i = x1[i] * d + x1[i + 1] * c;
      c = w[4 * q];
      d = w[4 * q + 1];
      const y2r = x2[i] * c - x2[i + 1] * d;
      const y2i = x2[i] * d + x2[i + 1] * c;
      c = w[6 * q];
      d = w[6 * q + 1];
      const y3r = x3[i] * c - x3[i + 1] * d;
      const y3i = x3[i] * d + x3[i + 1] * c;
      c = w[8 * q];
      d = w[8 * q + 1];
      const y4r = x4[i] * c - x4[i + 1] * d;
      const y4i = x4[i] * d + x4[i + 1] * c;
      const a1r = y1r + y4r;
      const a1i = y1i + y4i;
      const b1r = y1r - y4r;
      const b1i = y1i - y4i;
      const a2r = y2r + y3r;
      const a2i = y2i + y3i;
      const b2r = y2r - y3r;
      const b2i = y2i - y3i;
      const t1r = y0r + c1 * a1r + c2 * a2r;
      const t1i = y0i + c1 * a1i + c2 * a2i;
      const t2r = y0r + c2 * a1r + c1 * a2r;
      const t2i = y0i + c2 * a1i + c1 * a2i;
      const u1r = s1 * b1r + s2 * b2r;
      const u1i = s1 * b1i + s2 * b2i;
      const u2r = s2 * b1r - s1 * b2r;
      const u2i = s2 * b1i - s1 * b2i;
      put(out, bins, q, y0r + a1r + a2r, y0i + a1i + a2i);
      put(out, bins, q + l, t1r + u1i, t1i - u1r);
      put(out, bins, q + 2 * l, t2r + u2i, t2i - u2r);
      put(out, bins, q + 3 * l, t2r - u2i, t2i + u2r);
      put(out, bins, q + 4 * l, t1r - u1i, t1i + u1r);
    }
  }

  /** Any factor: the p-point DFT of the twiddled values, straight from its definition. */
  private combineAny(sub: Float64Array[], out: Float64Array, bins: number): void {
    const p = this.factor;
    const l = this.subSize;
    const w = this.twiddle;
    const root = this.root;
    const yr = new Float64Array(p);
    const yi = new Float64Array(p);
    const rootIndex = new Int32Array(p * p);
    for (let r = 0; r < p; r++)
      for (let s = 0; s < p; s++) rootIndex[s * p + r] = 2 * ((r * s) % p);
    for (let q = 0; q < l; q++) {
      for (let r = 0; r < p; r++) {
        const xr = sub[r][2 * q];
        const xi = sub[r][2 * q + 1];
        const t = 2 * r * q;
        yr[r] = xr * w[t] - xi * w[t + 1];
        yi[r] = xr * w[t + 1] + xi * w[t];
      }
      for (let s = 0; s < p; s++) {
        const k = q + l * s;
        if (k >= bins) break;
        let sr = 0;
        let si = 0;
        for (let r = 0; r < p; r++) {
          const j = rootIndex[s * p + r];
          sr += yr[r] * root[j] - yi[r] * root[j + 1];
          si += yr[r] * root[j + 1] + yi[r] * root[j];
        }
        out[2 * k] = sr;
        out[2 * k + 1] = si;
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

/** Writes bin k of an interleaved spectrum when k < bins. */
function put(out: Float64Array, bins: number, k: number, re: number, im: number): void {
  if (k < bins) {
    out[2 * k] = re;
    out[2 * k + 1] = im;
  }
}
