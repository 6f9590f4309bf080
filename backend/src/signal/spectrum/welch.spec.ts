import { readScipyFixture } from '../testing/scipy-fixtures';
import { alphaPeak, centreOfGravity } from './alpha-peak';
import { PowerSpectrum, welchPowerSpectrum } from './welch';

interface WelchFixture {
  sampleRateHz: number;
  segmentS: number;
  overlapFraction: number;
  input: number[];
  frequencyHz: number[];
  powerPerHz: number[];
}

/** Generated resting-like signal: a tone at `peakHz` over brown-ish noise. */
function restingSignal(
  fs: number,
  seconds: number,
  peakHz: number,
  amplitude: number,
): Float64Array {
  const n = fs * seconds;
  const x = new Float64Array(n);
  let seed = 17;
  const random = (): number => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648 - 0.5;
  };
  let walk = 0;
  for (let i = 0; i < n; i++) {
    walk = 0.98 * walk + random() * 6;
    x[i] = amplitude * Math.sin((2 * Math.PI * peakHz * i) / fs) + walk + random() * 2;
  }
  return x;
}

describe('Welch power spectrum against scipy.signal.welch', () => {
  it.each(['welch-250hz.json', 'welch-256hz.json'])('matches %s (relative 1e-9)', (name) => {
    // Reference: scipy.signal.welch, Hann, 4 s segments, 50 % overlap, density scaling.
    // 250 Hz gives 1000-sample segments (any-length DFT), 256 Hz gives 1024 (radix-4).
    const fixture = readScipyFixture<WelchFixture>(name);
    const spectrum = welchPowerSpectrum(Float64Array.from(fixture.input), {
      sampleRateHz: fixture.sampleRateHz,
      segmentS: fixture.segmentS,
      overlapFraction: fixture.overlapFraction,
    });
    expect(spectrum.frequencyHz.length).toBe(fixture.frequencyHz.length);
    const peak = Math.max(...fixture.powerPerHz);
    spectrum.powerPerHz.forEach((p, k) => {
      expect(Math.abs(p - fixture.powerPerHz[k])).toBeLessThanOrEqual(
        1e-9 * Math.max(Math.abs(fixture.powerPerHz[k]), peak * 1e-6),
      );
      expect(spectrum.frequencyHz[k]).toBeCloseTo(fixture.frequencyHz[k], 10);
    });
  });

  // Closed form for a cosine A·cos(2πk0·t/N) at an exact bin of the segment length N, Hann
  // window w[t] = ½ − ½·cos(2πt/N): |X[k0]| = A·N/4, |X[k0 ± 1]| = A·N/8, Σw² = 3N/8, so the
  // one-sided density is A²N/(3·fs) at k0, A²N/(12·fs) beside it and 0 elsewhere, in every
  // segment. Seven segments: three pairs and one transformed alone.
  it.each([
    [500, 41], // N = 2000 (mixed radix 2^4·5^3)
    [312.5, 400], // N = 1250 (2·5^4)
    [252.25, 44], // N = 1009, a prime (Bluestein)
  ])('matches the closed form for a cosine at an exact bin (fs = %f Hz, k0 = %i)', (fs, k0) => {
    const n = Math.round(4 * fs);
    const a = 7;
    const step = n - Math.floor(n / 2);
    const x = Float64Array.from(
      { length: n + 6 * step },
      (_, t) => 30 + a * Math.cos((2 * Math.PI * ((k0 * t) % n)) / n + 0.4),
    );
    const spectrum = welchPowerSpectrum(x, { sampleRateHz: fs });
    expect(spectrum.segmentCount).toBe(7);
    const peak = (a * a * n) / (3 * fs);
    const expected = new Float64Array(spectrum.powerPerHz.length);
    expected[k0] = peak;
    expected[k0 - 1] = expected[k0 + 1] = (a * a * n) / (12 * fs);
    spectrum.powerPerHz.forEach((p, k) => {
      expect(Math.abs(p - expected[k])).toBeLessThanOrEqual(peak * 1e-12);
    });
  });

  it('says what is missing when the recording is shorter than one segment', () => {
    expect(() => welchPowerSpectrum(new Float64Array(100), { sampleRateHz: 250 })).toThrow(
      /at least one segment of 1000 samples \(4 s\), got 100/,
    );
  });
});

describe('peak alpha frequency and centre of gravity', () => {
  it('finds a known peak within 0.05 Hz (generated resting signal, peak at 10.3 Hz)', () => {
    const fs = 250;
    const spectrum = welchPowerSpectrum(restingSignal(fs, 120, 10.3, 10), { sampleRateHz: fs });
    const peak = alphaPeak(spectrum);
    expect(peak.pafHz).not.toBeNull();
    expect(Math.abs((peak.pafHz as number) - 10.3)).toBeLessThan(0.05);
    expect(peak.prominenceDb as number).toBeGreaterThan(10);
  });

  it('answers "no clear peak" when nothing stands out of the 1/f background', () => {
    const fs = 250;
    const spectrum = welchPowerSpectrum(restingSignal(fs, 120, 10, 0), { sampleRateHz: fs });
    const peak = alphaPeak(spectrum);
    expect(peak.pafHz).toBeNull();
    expect(peak.noPeakReason).not.toBeNull();
  });

  it('computes CoG = Σ f·P / Σ P (Klimesch 1999) on a spectrum with a known answer', () => {
    // Closed form: P(f) = f on bins 0, 0.25, …, 20 Hz; over 7–13 Hz
    // Σ f² / Σ f with f = 7, 7.25, …, 13.
    const f = Float64Array.from({ length: 81 }, (_, k) => k * 0.25);
    const spectrum: PowerSpectrum = {
      frequencyHz: f,
      powerPerHz: f.slice(),
      segmentCount: 1,
      segmentSamples: 1000,
    };
    let num = 0;
    let den = 0;
    for (let v = 7; v <= 13; v += 0.25) {
      num += v * v;
      den += v;
    }
    expect(centreOfGravity(spectrum)).toBeCloseTo(num / den, 12);
    // A flat spectrum has its centre in the middle of the window.
    const flat: PowerSpectrum = { ...spectrum, powerPerHz: new Float64Array(81).fill(2) };
    expect(centreOfGravity(flat)).toBeCloseTo(10, 12);
  });
});
