import { addPinkNoise, fillSlowNoise } from './background-noise';
import { SeededRandom } from './prng';
import { scipyReference, ScratchFolder } from './testing/scipy-reference';

const scratch = new ScratchFolder();
afterAll(() => scratch.dispose());

describe('addPinkNoise (generated data)', () => {
  it('has the asked-for RMS and a 1/f spectrum: log-log slope −1 from 1 to 40 Hz (scipy.signal.welch)', () => {
    const sampleRateHz = 250;
    const x = new Float64Array(600 * sampleRateHz);
    addPinkNoise(x, new SeededRandom('pink/slope'), { sampleRateHz, rmsUv: 10 });
    const raw = scratch.write('pink.f64', x);
    const { slope, rms } = scipyReference<{ slope: number; rms: number }>({
      op: 'psd_slope',
      raw,
      fs: sampleRateHz,
      band: [1, 40],
    });
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
