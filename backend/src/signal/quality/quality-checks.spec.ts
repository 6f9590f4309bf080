import { welchPowerSpectrum } from '../spectrum/welch';
import {
  channelQuality,
  lineNoiseRatio,
  microvoltsPerUnit,
  saturatedShare,
} from './quality-checks';

describe('quality checks', () => {
  it('converts EDF physical units to µV', () => {
    expect(microvoltsPerUnit('uV')).toBe(1);
    expect(microvoltsPerUnit('µV')).toBe(1);
    expect(microvoltsPerUnit('mV')).toBe(1000);
    expect(microvoltsPerUnit('V')).toBe(1e6);
    expect(microvoltsPerUnit('degC')).toBeNull();
  });

  it('counts samples clipped at the physical range', () => {
    // Closed form: 3 of 10 samples sit on the limits.
    const x = Float32Array.from([-500, 0, 1, 2, 500, 3, 4, 499.9999, 5, 6]);
    expect(saturatedShare(x, { min: -500, max: 500 })).toBeCloseTo(0.3, 12);
  });

  it('finds a flat channel (standard deviation below 0.5 µV, common practice)', () => {
    const flat = channelQuality({ label: 'O1', samples: new Float32Array(1000).fill(3) });
    expect(flat.flat).toBe(true);
    const alive = channelQuality({
      label: 'O2',
      samples: Float32Array.from({ length: 1000 }, (_, i) => 10 * Math.sin(i / 5)),
    });
    expect(alive.flat).toBe(false);
  });

  it('measures a 50 Hz line-noise peak against its neighbourhood', () => {
    // Generated: white-ish noise plus a 50 Hz tone; without the tone the ratio is near 1.
    const fs = 250;
    let seed = 3;
    const noise = (): number => {
      seed = (seed * 1103515245 + 12345) % 2147483648;
      return seed / 2147483648 - 0.5;
    };
    const base = Float64Array.from({ length: 60 * fs }, () => 10 * noise());
    const humming = base.map((v, i) => v + 20 * Math.sin((2 * Math.PI * 50 * i) / fs));
    const quiet = lineNoiseRatio(welchPowerSpectrum(base, { sampleRateHz: fs }), 50) as number;
    const loud = lineNoiseRatio(welchPowerSpectrum(humming, { sampleRateHz: fs }), 50) as number;
    expect(Math.abs(quiet - 1)).toBeLessThan(0.3);
    expect(loud).toBeGreaterThan(50);
    // At 100 Hz sampling the band up to 50 + 6 Hz lies above Nyquist: no ratio.
    expect(
      lineNoiseRatio(welchPowerSpectrum(base.subarray(0, 6000), { sampleRateHz: 100 }), 50),
    ).toBeNull();
  });
});
