import { dftPlan } from './dft-any-length';
import { fftPlan, nextPowerOfTwo } from './fft-plan';
import { BandDftPlan, BandDftScratch, bandSubSize, PhaseSink, PhaseSource } from './band-dft';
import { mixedRadixLength, mixedRadixPlan } from './mixed-radix-fft';

/** Generated test signal (deterministic). */
function generated(n: number, seed: number): Float64Array {
  const x = new Float64Array(n);
  let s = seed;
  for (let i = 0; i < n; i++) {
    s = (s * 1103515245 + 12345) % 2147483648;
    x[i] = s / 2147483648 - 0.5 + Math.sin(i / 7);
  }
  return x;
}

function toComplex(x: Float64Array): Float64Array {
  const c = new Float64Array(2 * x.length);
  for (let i = 0; i < x.length; i++) c[2 * i] = x[i];
  return c;
}

/** DFT straight from its definition X[k] = Σ x[n]·e^(−2πikn/N). */
function naiveDft(c: Float64Array): Float64Array {
  const n = c.length / 2;
  const out = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    let re = 0;
    let im = 0;
    for (let j = 0; j < n; j++) {
      const a = (-2 * Math.PI * ((k * j) % n)) / n;
      re += c[2 * j] * Math.cos(a) - c[2 * j + 1] * Math.sin(a);
      im += c[2 * j] * Math.sin(a) + c[2 * j + 1] * Math.cos(a);
    }
    out[2 * k] = re;
    out[2 * k + 1] = im;
  }
  return out;
}

function maxAbs(a: Float64Array): number {
  let m = 0;
  for (const v of a) m = Math.max(m, Math.abs(v));
  return m;
}

function maxDiff(a: Float64Array, b: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

describe('FFT plans', () => {
  it('rounds lengths up to a power of two', () => {
    expect([1, 2, 3, 1000, 1024, 1025].map(nextPowerOfTwo)).toEqual([2, 2, 4, 1024, 1024, 2048]);
    expect(() => fftPlan(1000)).toThrow(/power of two/);
  });

  // Property: the inverse DFT undoes the forward DFT; tolerance scaled to N·log2 N·ε.
  it.each([8, 1024, 65536])('round-trips forward then inverse (N = %i)', (n) => {
    const x = toComplex(generated(n, 7));
    const plan = fftPlan(n);
    const spectrum = new Float64Array(2 * n);
    const back = new Float64Array(2 * n);
    plan.forward(x, spectrum);
    plan.inverse(spectrum, back);
    expect(maxDiff(back, x)).toBeLessThan(maxAbs(x) * Math.log2(n) * 8 * Number.EPSILON * 4);
  });

  // Property: Parseval's theorem Σ|x[n]|² = (1/N)·Σ|X[k]|².
  it.each([16, 4096])('keeps the energy (Parseval, N = %i)', (n) => {
    const x = generated(n, 3);
    const spectrum = new Float64Array(2 * n);
    fftPlan(n).forward(toComplex(x), spectrum);
    let timeEnergy = 0;
    for (const v of x) timeEnergy += v * v;
    let freqEnergy = 0;
    for (const v of spectrum) freqEnergy += v * v;
    expect(Math.abs(freqEnergy / n - timeEnergy) / timeEnergy).toBeLessThan(n * Number.EPSILON);
  });

  it('gives the same half spectrum from the real transform as from the complex one', () => {
    const n = 2048;
    const x = generated(n, 11);
    const plan = fftPlan(n);
    const real = new Float64Array(2 * n);
    const complex = new Float64Array(2 * n);
    plan.forwardReal(x, real);
    plan.forward(toComplex(x), complex);
    expect(maxDiff(real.subarray(0, n + 2), complex.subarray(0, n + 2))).toBeLessThan(
      maxAbs(complex) * 1e-13,
    );
  });

  // Against the DFT definition, for lengths that are not powers of two (Bluestein path).
  it.each([7, 100, 1000])('matches the DFT definition at any length (N = %i)', (n) => {
    const x = toComplex(generated(n, 5));
    for (let i = 0; i < n; i++) x[2 * i + 1] = Math.cos(i);
    const plan = dftPlan(n);
    const out = new Float64Array(2 * n);
    plan.forward(x, out, plan.createScratch());
    const expected = naiveDft(x);
    expect(maxDiff(out, expected)).toBeLessThan(maxAbs(expected) * 1e-12);
  });

  // Against the DFT definition for lengths p·2^a (one Cooley–Tukey step over fft.js).
  it.each([12, 20, 28, 192, 320, 448])('matches the DFT definition for mixed-radix N = %i', (n) => {
    const real = generated(n, 9);
    const x = toComplex(real);
    for (let i = 0; i < n; i++) x[2 * i + 1] = Math.sin(0.3 * i);
    const plan = mixedRadixPlan(n);
    const scratch = plan.createScratch();
    const out = new Float64Array(2 * n);
    plan.forward(x, out, scratch);
    const expected = naiveDft(x);
    expect(maxDiff(out, expected)).toBeLessThan(maxAbs(expected) * 1e-12);
    const half = new Float64Array(2 * n);
    plan.forwardReal(real, half, scratch);
    const expectedReal = naiveDft(toComplex(real));
    expect(maxDiff(half.subarray(0, n + 2), expectedReal.subarray(0, n + 2))).toBeLessThan(
      maxAbs(expectedReal) * 1e-12,
    );
  });

  it('picks the shortest p·2^a length that holds the samples', () => {
    expect(mixedRadixLength(303334)).toBe(327680); // 5·2^16
    expect(mixedRadixLength(1803334)).toBe(1835008); // 7·2^18
    expect(mixedRadixLength(4096)).toBe(4096);
    expect(mixedRadixLength(4097)).toBe(5120); // 5·2^10
  });
});

describe('band DFT (decimated, pruned to a band of bins)', () => {
  class ArraySource implements PhaseSource {
    constructor(
      private readonly x: Float64Array,
      private readonly decimation: number,
    ) {}
    readPhases(firstPhase: number, out: readonly Float64Array[]): void {
      out.forEach((phase, j) => {
        for (let u = 0; u < phase.length; u++)
          phase[u] = this.x[u * this.decimation + firstPhase + j];
      });
    }
  }
  class ArraySink implements PhaseSink {
    readonly y: Float64Array;
    constructor(
      size: number,
      private readonly decimation: number,
    ) {
      this.y = new Float64Array(2 * size);
    }
    takePhases(firstPhase: number, y: readonly Float64Array[]): void {
      y.forEach((phase, j) => {
        for (let u = 0; 2 * u < phase.length; u++) {
          const t = u * this.decimation + firstPhase + j;
          this.y[2 * t] = phase[2 * u];
          this.y[2 * t + 1] = phase[2 * u + 1];
        }
      });
    }
  }

  // Against the DFT definition; the band folds onto the short transform when it is
  // wider than L (cases 2 and 4) and the decimation D is not a multiple of the phase group.
  it.each([
    [448, 16, 30, 41],
    [448, 16, 3, 150],
    [320, 64, 0, 160],
    [96, 8, 40, 95],
    [640, 32, 30, 180],
  ])('matches the DFT definition for M = %i, L = %i, bins %i…%i', (m, l, first, last) => {
    const x = generated(m, 13);
    const plan = new BandDftPlan(m, l);
    const scratch = new BandDftScratch();
    const band = new Float64Array(2 * (last - first + 1));
    plan.forwardRealBand(new ArraySource(x, plan.decimation), first, last, band, scratch);
    const expected = naiveDft(toComplex(x));
    const wanted = expected.subarray(2 * first, 2 * last + 2);
    expect(maxDiff(band, wanted)).toBeLessThan(maxAbs(expected) * 1e-12);

    // Inverse of a spectrum that is zero outside the band: conj(M·IDFT(Z)) = DFT(conj Z).
    const conjBand = Float64Array.from(band, (v, i) => (i % 2 === 0 ? v : -v));
    const sink = new ArraySink(m, plan.decimation);
    plan.inverseBand(conjBand, first, last, sink, scratch);
    const full = new Float64Array(2 * m);
    full.set(conjBand, 2 * first);
    const direct = naiveDft(full);
    expect(maxDiff(sink.y, direct)).toBeLessThan(maxAbs(direct) * 1e-12);
  });

  it('chooses a power-of-two short length that divides M and holds the band', () => {
    expect(bandSubSize(1835008, 24955, 54867)).toBe(32768); // 7·2^18: 29 913 bins
    expect(bandSubSize(327680, 4456, 9795)).toBe(8192); // 5·2^16: 5 340 bins
    expect(bandSubSize(448, 0, 224)).toBe(64); // only 2^6 divides 448
    expect(bandSubSize(1 << 20, 0, 10)).toBe(4096); // at least M/256
    expect(() => new BandDftPlan(448, 128)).toThrow(/size = D·subSize/);
  });
});
