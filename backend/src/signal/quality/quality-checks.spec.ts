import { welchPowerSpectrum } from '../spectrum/welch';
import {
  channelQuality,
  lineNoiseRatio,
  microvoltsPerUnit,
  quantisationStep,
  railRunShare,
  SATURATION_MAX_SHARE,
  SATURATION_MIN_RUN_SAMPLES,
} from './quality-checks';

describe('quality checks', () => {
  it('converts EDF physical units to µV', () => {
    expect(microvoltsPerUnit('uV')).toBe(1);
    expect(microvoltsPerUnit('µV')).toBe(1);
    expect(microvoltsPerUnit('mV')).toBe(1000);
    expect(microvoltsPerUnit('V')).toBe(1e6);
    expect(microvoltsPerUnit('degC')).toBeNull();
  });

  it('computes the quantisation step of the EDF physical-value formula', () => {
    // EDF (Kemp et al. 1992): physical = (digital − dmin)·(pmax − pmin)/(dmax − dmin) + pmin.
    expect(quantisationStep({ physicalMin: -500, physicalMax: 500 })).toBe(1000 / 65535);
    expect(
      quantisationStep({ physicalMin: 0, physicalMax: 4095, digitalMin: 0, digitalMax: 4095 }),
    ).toBe(1);
  });

  it('counts only runs of at least N samples at a rail, N = 5 (common practice)', () => {
    expect(SATURATION_MIN_RUN_SAMPLES).toBe(5);
    expect(SATURATION_MAX_SHARE).toBe(0.01);
    const range = { physicalMin: -500, physicalMax: 500 };
    // Closed form: a run of 6 at the top and one of 5 at the bottom count (11 of 24 samples);
    // the run of 4 at the top and the isolated rail samples do not.
    const x = Float32Array.from([
      0, 500, 500, 500, 500, 500, 500, 3, 500, 500, 500, 500, 2, -500, 1, -500, -500, -500, -500,
      -500, 4, 500, -500, 5,
    ]);
    expect(x.length).toBe(24);
    expect(railRunShare(x, range)).toBe(11 / 24);
    // Alternating rails are not one run.
    expect(railRunShare(Float32Array.from([500, -500, 500, -500, 500, -500]), range)).toBe(0);
  });

  it('puts the rail within half a quantisation step (EDF digital rounding, Kemp et al. 1992)', () => {
    const range = { physicalMin: -500, physicalMax: 500, digitalMin: -32768, digitalMax: 32767 };
    const q = quantisationStep(range);
    const near = new Float64Array(10).fill(500 - 0.4 * q);
    const off = new Float64Array(10).fill(500 - 0.6 * q);
    const beyond = new Float64Array(10).fill(-520);
    expect(railRunShare(near, range)).toBe(1);
    expect(railRunShare(off, range)).toBe(0);
    expect(railRunShare(beyond, range)).toBe(1);
  });

  it('calls a channel saturated only when rail runs cover more than 1 % of it', () => {
    // Generated: a 10 Hz sinusoid at 240 Hz (24 samples a cycle), so sample 6 of each cycle is
    // sin(π/2) = 1 and sample 18 is −1: its peaks lie exactly on the range, one sample each.
    const n = 960;
    const tone = Float32Array.from({ length: n }, (_, i) => 40 * Math.sin((2 * Math.PI * i) / 24));
    const range = { physicalMin: -40, physicalMax: 40 };
    expect(tone.filter((v) => v === 40).length).toBe(40);
    const clean = channelQuality({ label: 'O1', samples: tone, ...range });
    expect(clean.saturatedShare).toBe(0);
    expect(clean.saturated).toBe(false);
    // Held at the top from sample 490 (between two natural peaks): 9 of 960 samples are
    // 0.94 %, not more than 1 %; 10 are 1.04 %.
    const clipped = (count: number): Float32Array => {
      const x = tone.slice();
      x.fill(40, 490, 490 + count);
      return x;
    };
    const nine = channelQuality({ label: 'O1', samples: clipped(9), ...range });
    expect(nine.saturatedShare).toBe(9 / n);
    expect(nine.saturated).toBe(false);
    const ten = channelQuality({ label: 'O1', samples: clipped(10), ...range });
    expect(ten.saturatedShare).toBe(10 / n);
    expect(ten.saturated).toBe(true);
    expect(channelQuality({ label: 'O1', samples: tone }).saturatedShare).toBeNull();
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
