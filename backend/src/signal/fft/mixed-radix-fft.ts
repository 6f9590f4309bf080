// Hand-written: fft.js takes powers of two only; npm's any-length FFTs are single precision or Bluestein.
import { checkLength, ComplexDft, DftScratch } from './complex-dft';

/** Odd factors `mixedRadixLength` allows in front of a power of two. */
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

/**
 * Largest prime the mixed-radix plan takes as one butterfly. A prime p costs about p/2
 * complex multiply-adds per output where Bluestein costs three power-of-two FFTs of
 * ≥ 2N; measured with a script on N = p·8 and p·64, the folded butterfly stays ahead up
 * to p ≈ 47–79, so 31 leaves a margin.
 */
export const LARGEST_RADIX = 31;

/**
 * The radices of a length n, radix 4 first, then 2, then odd primes in ascending order
 * (e.g. 2000 → 4, 4, 5, 5, 5); null when a prime factor exceeds `LARGEST_RADIX`.
 */
export function radixFactors(n: number): number[] | null {
  if (!Number.isInteger(n) || n < 1) {
    throw new RangeError(`FFT size: expected a positive integer, got ${n}`);
  }
  const factors: number[] = [];
  let rest = n;
  while (rest % 4 === 0) {
    factors.push(4);
    rest /= 4;
  }
  if (rest % 2 === 0) {
    factors.push(2);
    rest /= 2;
  }
  for (let p = 3; p * p <= rest; p += 2) {
    while (rest % p === 0) {
      factors.push(p);
      rest /= p;
    }
  }
  if (rest > 1) factors.push(rest);
  return factors.every((p) => p <= LARGEST_RADIX) ? factors : null;
}

/** One decimation-in-frequency pass: `radix`-point butterflies over sub-length n = radix·m. */
interface Pass {
  radix: number;
  m: number;
  stride: number;
  /** W_n^(p·k) for p < m, 1 ≤ k < radix, interleaved at 2·(p·(radix − 1) + k − 1). */
  twiddle: Float64Array;
}

/**
 * Forward complex DFT of any length whose prime factors are at most `LARGEST_RADIX`,
 * by the Stockham autosort form of the mixed-radix Cooley–Tukey FFT (common practice):
 * each pass splits the sub-length n = r·m as
 * X[r·k′ + k] = Σ_p W_m^(p·k′) · W_n^(p·k) · Σ_j x[p + j·m]·W_r^(j·k),
 * writing y[q + s·(r·p + k)] for each of the s interleaved sub-problems, so the output
 * comes out in natural order with no bit reversal. Radices 2, 3, 4 and 5 have
 * hand-folded butterflies; other primes use the definition folded on its symmetry.
 */
export class MixedRadixFftPlan implements ComplexDft {
  readonly size: number;
  private readonly passes: Pass[];
  /** W_r^t = e^(−2πit/r) for the generic radices, keyed by r. */
  private readonly roots = new Map<number, Float64Array>();

  constructor(size: number) {
    const factors = radixFactors(size);
    if (factors === null) {
      throw new RangeError(
        `mixed-radix FFT size: expected prime factors ≤ ${LARGEST_RADIX}, got ${size}`,
      );
    }
    this.size = size;
    this.passes = [];
    let n = size;
    let stride = 1;
    for (const radix of factors) {
      const m = n / radix;
      const twiddle = new Float64Array(2 * m * (radix - 1));
      for (let p = 0; p < m; p++) {
        for (let k = 1; k < radix; k++) {
          // p·k < n keeps the angle within one turn.
          const angle = (-2 * Math.PI * p * k) / n;
          const t = 2 * (p * (radix - 1) + k - 1);
          twiddle[t] = Math.cos(angle);
          twiddle[t + 1] = Math.sin(angle);
        }
      }
      this.passes.push({ radix, m, stride, twiddle });
      if (radix > 5 && !this.roots.has(radix)) this.roots.set(radix, rootsOfUnity(radix));
      n = m;
      stride *= radix;
    }
  }

  createScratch(): DftScratch {
    return {
      a: new Float64Array(this.passes.length > 1 ? 2 * this.size : 0),
      b: new Float64Array(0),
    };
  }

  forward(input: Float64Array, output: Float64Array, scratch: DftScratch): void {
    checkLength(input, 2 * this.size, 'input');
    checkLength(output, 2 * this.size, 'output');
    const count = this.passes.length;
    if (count === 0) {
      output.set(input);
      return;
    }
    if (count > 1) checkLength(scratch.a, 2 * this.size, 'scratch');
    // Ping-pong between output and scratch, starting so that the last pass lands in output.
    let source = input;
    for (let i = 0; i < count; i++) {
      const target = (count - 1 - i) % 2 === 0 ? output : scratch.a;
      this.runPass(this.passes[i], source, target);
      source = target;
    }
  }

  private runPass(pass: Pass, x: Float64Array, y: Float64Array): void {
    switch (pass.radix) {
      case 2:
        return pass2(pass, x, y);
      case 3:
        return pass3(pass, x, y);
      case 4:
        return pass4(pass, x, y);
      case 5:
        return pass5(pass, x, y);
      default:
        return passGeneric(pass, x, y, this.roots.get(pass.radix) as Float64Array);
    }
  }
}

function rootsOfUnity(r: number): Float64Array {
  const roots = new Float64Array(2 * r);
  for (let t = 0; t < r; t++) {
    roots[2 * t] = Math.cos((-2 * Math.PI * t) / r);
    roots[2 * t + 1] = Math.sin((-2 * Math.PI * t) / r);
  }
  return roots;
}

/** y[at], y[at + 1] = (zr + i·zi)·(wr + i·wi): one butterfly output times its twiddle. */
function rotateInto(
  y: Float64Array,
  at: number,
  zr: number,
  zi: number,
  wr: number,
  wi: number,
): void {
  y[at] = zr * wr - zi * wi;
  y[at + 1] = zr * wi + zi * wr;
}

// In every pass, input element j of butterfly (p, q) is at 2·(q + s·(p + j·m)) and output
// k goes to 2·(q + s·(r·p + k)), multiplied by the twiddle W_n^(p·k).

/** Radix 2: A0 = a0 + a1, A1 = a0 − a1. */
function pass2({ m, stride: s, twiddle: tw }: Pass, x: Float64Array, y: Float64Array): void {
  const span = 2 * s;
  for (let p = 0; p < m; p++) {
    const w1r = tw[2 * p];
    const w1i = tw[2 * p + 1];
    const i0 = span * p;
    const i1 = i0 + span * m;
    const o0 = 2 * span * p;
    const o1 = o0 + span;
    for (let q = 0; q < span; q += 2) {
      const ar = x[i0 + q];
      const ai = x[i0 + q + 1];
      const br = x[i1 + q];
      const bi = x[i1 + q + 1];
      y[o0 + q] = ar + br;
      y[o0 + q + 1] = ai + bi;
      const dr = ar - br;
      const di = ai - bi;
      rotateInto(y, o1 + q, dr, di, w1r, w1i);
    }
  }
}

/** Radix 3 with W3 = −½ − i·√3/2: A0 = a0 + a1 + a2, A1,2 = a0 − ½(a1 + a2) ∓ i·(√3/2)(a1 − a2). */
function pass3({ m, stride: s, twiddle: tw }: Pass, x: Float64Array, y: Float64Array): void {
  const h = Math.sqrt(3) / 2;
  const span = 2 * s;
  for (let p = 0; p < m; p++) {
    const w1r = tw[4 * p];
    const w1i = tw[4 * p + 1];
    const w2r = tw[4 * p + 2];
    const w2i = tw[4 * p + 3];
    const i0 = span * p;
    const i1 = i0 + span * m;
    const i2 = i1 + span * m;
    const o0 = 3 * span * p;
    const o1 = o0 + span;
    const o2 = o1 + span;
    for (let q = 0; q < span; q += 2) {
      const a0r = x[i0 + q];
      const a0i = x[i0 + q + 1];
      const a1r = x[i1 + q];
      const a1i = x[i1 + q + 1];
      const a2r = x[i2 + q];
      const a2i = x[i2 + q + 1];
      const sr = a1r + a2r;
      const si = a1i + a2i;
      const tr = a0r - 0.5 * sr;
      const ti = a0i - 0.5 * si;
      const ur = h * (a1r - a2r);
      const ui = h * (a1i - a2i);
      y[o0 + q] = a0r + sr;
      y[o0 + q + 1] = a0i + si;
      rotateInto(y, o1 + q, tr + ui, ti - ur, w1r, w1i);
      rotateInto(y, o2 + q, tr - ui, ti + ur, w2r, w2i);
    }
  }
}

/** Radix 4 with W4 = −i: A0,2 = (a0 + a2) ± (a1 + a3), A1,3 = (a0 − a2) ∓ i·(a1 − a3). */
function pass4({ m, stride: s, twiddle: tw }: Pass, x: Float64Array, y: Float64Array): void {
  const span = 2 * s;
  for (let p = 0; p < m; p++) {
    const w1r = tw[6 * p];
    const w1i = tw[6 * p + 1];
    const w2r = tw[6 * p + 2];
    const w2i = tw[6 * p + 3];
    const w3r = tw[6 * p + 4];
    const w3i = tw[6 * p + 5];
    const i0 = span * p;
    const i1 = i0 + span * m;
    const i2 = i1 + span * m;
    const i3 = i2 + span * m;
    const o0 = 4 * span * p;
    const o1 = o0 + span;
    const o2 = o1 + span;
    const o3 = o2 + span;
    for (let q = 0; q < span; q += 2) {
      const a0r = x[i0 + q];
      const a0i = x[i0 + q + 1];
      const a1r = x[i1 + q];
      const a1i = x[i1 + q + 1];
      const a2r = x[i2 + q];
      const a2i = x[i2 + q + 1];
      const a3r = x[i3 + q];
      const a3i = x[i3 + q + 1];
      const t0r = a0r + a2r;
      const t0i = a0i + a2i;
      const t1r = a0r - a2r;
      const t1i = a0i - a2i;
      const t2r = a1r + a3r;
      const t2i = a1i + a3i;
      // −i·(a1 − a3)
      const t3r = a1i - a3i;
      const t3i = a3r - a1r;
      y[o0 + q] = t0r + t2r;
      y[o0 + q + 1] = t0i + t2i;
      rotateInto(y, o1 + q, t1r + t3r, t1i + t3i, w1r, w1i);
      rotateInto(y, o2 + q, t0r - t2r, t0i - t2i, w2r, w2i);
      rotateInto(y, o3 + q, t1r - t3r, t1i - t3i, w3r, w3i);
    }
  }
}

/**
 * Radix 5 with c_j = cos(2πj/5), s_j = sin(2πj/5): with a1 = y1 + y4, b1 = y1 − y4,
 * a2 = y2 + y3, b2 = y2 − y3: A1,4 = y0 + c1·a1 + c2·a2 ∓ i(s1·b1 + s2·b2) and
 * A2,3 = y0 + c2·a1 + c1·a2 ∓ i(s2·b1 − s1·b2).
 */
function pass5({ m, stride: s, twiddle: tw }: Pass, x: Float64Array, y: Float64Array): void {
  const c1 = Math.cos((2 * Math.PI) / 5);
  const c2 = Math.cos((4 * Math.PI) / 5);
  const s1 = Math.sin((2 * Math.PI) / 5);
  const s2 = Math.sin((4 * Math.PI) / 5);
  const span = 2 * s;
  for (let p = 0; p < m; p++) {
    const t = 8 * p;
    const w1r = tw[t];
    const w1i = tw[t + 1];
    const w2r = tw[t + 2];
    const w2i = tw[t + 3];
    const w3r = tw[t + 4];
    const w3i = tw[t + 5];
    const w4r = tw[t + 6];
    const w4i = tw[t + 7];
    const i0 = span * p;
    const i1 = i0 + span * m;
    const i2 = i1 + span * m;
    const i3 = i2 + span * m;
    const i4 = i3 + span * m;
    const o0 = 5 * span * p;
    const o1 = o0 + span;
    const o2 = o1 + span;
    const o3 = o2 + span;
    const o4 = o3 + span;
    for (let q = 0; q < span; q += 2) {
      const y0r = x[i0 + q];
      const y0i = x[i0 + q + 1];
      const y1r = x[i1 + q];
      const y1i = x[i1 + q + 1];
      const y2r = x[i2 + q];
      const y2i = x[i2 + q + 1];
      const y3r = x[i3 + q];
      const y3i = x[i3 + q + 1];
      const y4r = x[i4 + q];
      const y4i = x[i4 + q + 1];
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
      y[o0 + q] = y0r + a1r + a2r;
      y[o0 + q + 1] = y0i + a1i + a2i;
      rotateInto(y, o1 + q, t1r + u1i, t1i - u1r, w1r, w1i);
      rotateInto(y, o2 + q, t2r + u2i, t2i - u2r, w2r, w2i);
      rotateInto(y, o3 + q, t2r - u2i, t2i + u2r, w3r, w3i);
      rotateInto(y, o4 + q, t1r - u1i, t1i + u1r, w4r, w4i);
    }
  }
}

/**
 * Any odd prime radix r, from the definition folded on its symmetry: with h = (r − 1)/2,
 * s_j = a_j + a_(r−j) and d_j = a_j − a_(r−j) for 1 ≤ j ≤ h,
 * A_k, A_(r−k) = a0 + Σ_j s_j·cos(2πjk/r) ∓ i·Σ_j d_j·sin(2πjk/r) (as radix 5 above).
 */
function passGeneric(
  { radix: r, m, stride: s, twiddle: tw }: Pass,
  x: Float64Array,
  y: Float64Array,
  roots: Float64Array,
): void {
  const span = 2 * s;
  const h = (r - 1) / 2;
  const sr = new Float64Array(h + 1);
  const si = new Float64Array(h + 1);
  const dr = new Float64Array(h + 1);
  const di = new Float64Array(h + 1);
  for (let p = 0; p < m; p++) {
    const i0 = span * p;
    const o0 = r * span * p;
    const t0 = 2 * p * (r - 1);
    for (let q = 0; q < span; q += 2) {
      const a0r = x[i0 + q];
      const a0i = x[i0 + q + 1];
      let sumR = a0r;
      let sumI = a0i;
      for (let j = 1; j <= h; j++) {
        const lo = i0 + j * span * m + q;
        const hi = i0 + (r - j) * span * m + q;
        sr[j] = x[lo] + x[hi];
        si[j] = x[lo + 1] + x[hi + 1];
        dr[j] = x[lo] - x[hi];
        di[j] = x[lo + 1] - x[hi + 1];
        sumR += sr[j];
        sumI += si[j];
      }
      y[o0 + q] = sumR;
      y[o0 + q + 1] = sumI;
      for (let k = 1; k <= h; k++) {
        let tr = a0r;
        let ti = a0i;
        let ur = 0;
        let ui = 0;
        for (let j = 1, jk = k; j <= h; j++) {
          // roots holds cos(2πt/r) and −sin(2πt/r) for t = j·k mod r.
          const c = roots[2 * jk];
          const sn = -roots[2 * jk + 1];
          tr += c * sr[j];
          ti += c * si[j];
          ur += sn * dr[j];
          ui += sn * di[j];
          jk += k;
          if (jk >= r) jk -= r;
        }
        const w = t0 + 2 * (k - 1);
        rotateInto(y, o0 + k * span + q, tr + ui, ti - ur, tw[w], tw[w + 1]);
        const v = t0 + 2 * (r - k - 1);
        rotateInto(y, o0 + (r - k) * span + q, tr - ui, ti + ur, tw[v], tw[v + 1]);
      }
    }
  }
}
