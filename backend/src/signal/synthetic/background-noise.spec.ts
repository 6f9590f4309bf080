import { execFileSync } from 'node:child_process';
import { SeededRandom } from '../random/random';
import { addPinkNoise, fillSlowNoise } from './background-noise';

/**
 * scipy.signal.welch (4 s Hann, 50 % overlap; Debian python3-scipy) of little-endian float64
 * samples on stdin, then a least-squares line through log10 power over log10 frequency.
 */
function scipyPsdSlope(
  x: Float64Array,
  sampleRateHz: number,
  band: readonly [number, number],
): { slope: number; rms: number } {
  const script = [
    'import json, sys',
    'import numpy as np',
    'from scipy import signal',
    "x = np.frombuffer(sys.stdin.buffer.read(), dtype='<f8')",
    `fs, lo, hi = ${sampleRateHz}, ${band[0]}, ${band[1]}`,
    "f, p = signal.welch(x, fs=fs, window='hann', nperseg=int(4 * fs), noverlap=int(2 * fs))",
    'sel = (f >= lo) & (f <= hi)',
    'slope = np.polyfit(np.log10(f[sel]), np.log10(p[sel]), 1)[0]',
    "print(json.dumps({'slope': float(slope), 'rms': float(np.sqrt(np.mean(x ** 2)))}))",
  ].join('\n');
  const out = execFileSync('python3', ['-c', script], {
    input: Buffer.from(x.buffer, x.byteOffset, x.byteLength),
  });
  return JSON.parse(out.toString()) as { slope: number; rms: number };
}

describe('addPinkNoise (generated data)', () => {
  it('has the asked-for RMS and a 1/f spectrum: log-log slope −1 from 1 to 40 Hz (scipy.signal.welch)', () => {
    const sampleRateHz = 250;
    const x = new Float64Array(600 * sampleRateHz);
    addPinkNoise(x, new SeededRandom('pink/slope'), { sampleRateHz, rmsUv: 10 });
    const { slope, rms } = scipyPsdSlope(x, sampleRateHz, [1, 40]);
    // 1/f means a slope of −1 on log-log axes (definition); the sum of Lorentzians ripples a little.
    expect(slope).toBeGreaterThan(-1.15);
    expect(slope).toBeLessThan(-0.85);
    // The slowest stage (0.3 Hz) makes the sample RMS wander: 10 % of 10 µV.
    expect(Math.abs(rms - 10)).toBeLessThan(1);
  });

  it('adds to what is already in the buffer', () => {
    const x = new Float64Array(1000).fill(5);
    addPinkNoise(x, new SeededRandom('pink/add'), { sampleRateHz: 250, rmsUv: 0 });
    expect(Array.from(x).every((v) => v === 5)).toBe(true);
  });
});

describe('fillSlowNoise (generated data)', () => {
  it('is a unit-variance AR(1) whose lag-1 correlation is exp(−1/(τ·fs)) (closed form)', () => {
    const sampleRateHz = 250;
    const timeConstantS = 0.05;
    const x = new Float64Array(400_000);
    fillSlowNoise(x, new SeededRandom('slow/ar1'), { sampleRateHz, timeConstantS });
    let sumSq = 0;
    let lag1 = 0;
    for (let n = 0; n < x.length; n++) {
      sumSq += x[n] * x[n];
      if (n > 0) lag1 += x[n] * x[n - 1];
    }
    const variance = sumSq / x.length;
    expect(Math.abs(variance - 1)).toBeLessThan(0.05);
    expect(lag1 / sumSq).toBeCloseTo(Math.exp(-1 / (timeConstantS * sampleRateHz)), 2);
  });
});
