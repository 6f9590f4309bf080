import { readScipyFixture } from '../testing/scipy-fixtures';
import { BluesteinDft, dftPlan } from './dft-any-length';
import { fftPlan, nextPowerOfTwo } from './fft-plan';
import { BandDftPlan, BandDftScratch, bandSubSize, PhaseSink, PhaseSource } from './band-dft';
import { MixedRadixFftPlan, mixedRadixLength, radixFactors } from './mixed-radix-fft';

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

  // Against the DFT definition at lengths of every plan kind: fft.js (1024), mixed radix
  // (12 = 4·3, 100, 1000 = 4·2·5³, 2000, 1250 = 2·5⁴, 7, 29·4 with a generic radix) and
  // Bluestein (37·8 and the prime 1009).
  it.each([1, 2, 7, 12, 100, 116, 296, 1000, 1009, 1024, 1250, 2000])(
    'matches the DFT definition at any length (N = %i)',
    (n) => {
      const x = toComplex(generated(n, 5));
      for (let i = 0; i < n; i++) x[2 * i + 1] = Math.cos(i);
      const plan = dftPlan(n);
      const out = new Float64Array(2 * n);
      plan.forward(x, out, plan.createScratch());
      const expected = naiveDft(x);
      expect(maxDiff(out, expected)).toBeLessThan(maxAbs(expected) * 1e-12);
    },
  );

  it('chooses the plan by the prime factors of the length', () => {
    expect(radixFactors(2000)).toEqual([4, 4, 5, 5, 5]);
    expect(radixFactors(1000)).toEqual([4, 2, 5, 5, 5]);
    expect(radixFactors(1250)).toEqual([2, 5, 5, 5, 5]);
    expect(radixFactors(29 * 4)).toEqual([4, 29]);
    expect(radixFactors(37 * 8)).toBeNull();
    expect(dftPlan(2000)).toBeInstanceOf(MixedRadixFftPlan);
    expect(dftPlan(1009)).toBeInstanceOf(BluesteinDft);
  });

  it('picks the shortest p·2^a length that holds the samples', () => {
    expect(mixedRadixLength(303334)).toBe(327680); // 5·2^16
    expect(mixedRadixLength(1803334)).toBe(1835008); // 7·2^18
    expect(mixedRadixLength(4096)).toBe(4096);
    expect(mixedRadixLength(4097)).toBe(5120); // 5·2^10
  });
});

interface RfftFixture {
  source: string;
  cases: { size: number; input: number[]; re: number[]; im: number[] }[];
}

/** Bins 0 … ⌊N/2⌋ of the any-length DFT of a real input (imaginary part zero), interleaved. */
function realInputDft(x: Float64Array): Float64Array {
  const n = x.length;
  const plan = dftPlan(n);
  const out = new Float64Array(2 * n);
  plan.forward(toComplex(x), out, plan.createScratch());
  return out.slice(0, 2 * (Math.floor(n / 2) + 1));
}

describe('any-length DFT of a real input (what Welch transforms)', () => {
  // Reference: numpy.fft.rfft on the fixture inputs (backend/scripts/scipy_reference.py).
  // 1000, 2000 and 1250 (Welch's 4 s at 250, 500 and 312.5 Hz) and 375 go through the
  // mixed-radix plan, 1024 through fft.js, 1009 (prime) and 1006 (= 2·503) through Bluestein.
  it.each(readScipyFixture<RfftFixture>('rfft.json').cases.map((c) => [c.size, c] as const))(
    'matches numpy.fft.rfft at N = %i',
    (n, fixture) => {
      const out = realInputDft(Float64Array.from(fixture.input));
      expect(fixture.re.length).toBe(Math.floor(n / 2) + 1);
      expect(out.length).toBe(2 * fixture.re.length);
      let peak = 0;
      fixture.re.forEach((re, k) => (peak = Math.max(peak, Math.hypot(re, fixture.im[k]))));
      fixture.re.forEach((re, k) => {
        expect(Math.abs(out[2 * k] - re)).toBeLessThanOrEqual(peak * 1e-12);
        expect(Math.abs(out[2 * k + 1] - fixture.im[k])).toBeLessThanOrEqual(peak * 1e-12);
      });
    },
  );

  // Closed form: c + A·cos(2πk0·t/N + φ) has X[0] = c·N, X[k0] = (A·N/2)·e^(iφ), every
  // other bin up to N/2 zero.
  it.each([
    [2000, 41],
    [1000, 499],
    [1250, 3],
    [1024, 200],
    [1009, 40],
    [375, 187],
  ])('puts a cosine at an exact bin into that bin alone (N = %i, k0 = %i)', (n, k0) => {
    const c = 1.5;
    const a = 2;
    const phase = 0.7;
    const x = Float64Array.from(
      { length: n },
      (_, t) => c + a * Math.cos((2 * Math.PI * ((k0 * t) % n)) / n + phase),
    );
    const out = realInputDft(x);
    const expected = new Float64Array(out.length);
    expected[0] = c * n;
    expected[2 * k0] = ((a * n) / 2) * Math.cos(phase);
    expected[2 * k0 + 1] = ((a * n) / 2) * Math.sin(phase);
    expect(maxDiff(out, expected)).toBeLessThan(a * n * 1e-13);
  });

  // Parseval's theorem Σ|x[n]|² = (1/N)·Σ|X[k]|² at the mixed-radix and Bluestein lengths.
  it.each([2000, 1000, 1250, 1009])('keeps the energy (Parseval, N = %i)', (n) => {
    const x = toComplex(generated(n, 21));
    for (let i = 0; i < n; i++) x[2 * i + 1] = Math.sin(0.01 * i * i);
    const plan = dftPlan(n);
    const spectrum = new Float64Array(2 * n);
    plan.forward(x, spectrum, plan.createScratch());
    let timeEnergy = 0;
    for (const v of x) timeEnergy += v * v;
    let freqEnergy = 0;
    for (const v of spectrum) freqEnergy += v * v;
    expect(Math.abs(freqEnergy / n - timeEnergy) / timeEnergy).toBeLessThan(1e-13);
  });

  it('refuses buffers of the wrong length instead of returning wrong bins', () => {
    for (const n of [2000, 1009]) {
      const plan = dftPlan(n);
      const scratch = plan.createScratch();
      expect(() =>
        plan.forward(new Float64Array(2 * n - 2), new Float64Array(2 * n), scratch),
      ).toThrow(new RegExp(`input: expected length ${2 * n}, got ${2 * n - 2}`));
      expect(() => plan.forward(new Float64Array(2 * n), new Float64Array(n), scratch)).toThrow(
        new RegExp(`output: expected length ${2 * n}, got ${n}`),
      );
    }
    expect(() => dftPlan(0)).toThrow(/positive integer/);
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
