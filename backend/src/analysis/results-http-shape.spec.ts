import { roundSignificant, roundTo, trialRasterOf } from './results-http-shape';
import type { RunSummary } from '../jobs/worker/worker-tasks';
import { seededUniform } from '../signal/random/random';

describe('rounding of the results series', () => {
  it('rounds as ECMAScript Number.prototype.toFixed does (exact decimal rounding of the double)', () => {
    const next = seededUniform(20260115);
    for (let i = 0; i < 20_000; i++) {
      const value = (next() - 0.5) * 40;
      for (const decimals of [2, 4]) {
        // toFixed is exact and ties away from zero once the sign is set aside (ECMA-262
        // §21.1.3.3); `+ 0` because it may give "-0.00", which JSON writes as 0 anyway.
        expect(roundTo(value, decimals)).toBe(Number(value.toFixed(decimals)) + 0);
      }
    }
  });

  it('writes at most the documented decimals in JSON and stays within half a unit', () => {
    const next = seededUniform(7);
    for (let i = 0; i < 5_000; i++) {
      const value = 8 + next() * 5;
      const rounded = roundTo(value, 4) as number;
      expect((JSON.stringify(rounded).split('.')[1] ?? '').length).toBeLessThanOrEqual(4);
      expect(Math.abs(rounded - value)).toBeLessThanOrEqual(0.5e-4 + 1e-12);
    }
  });

  it('turns a missing value into null and never writes -0', () => {
    expect(roundTo(Number.NaN, 4)).toBeNull();
    expect(roundTo(Infinity, 4)).toBeNull();
    expect(Object.is(roundTo(-0.00001, 4), 0)).toBe(true);
    expect(roundSignificant(Number.NaN, 4)).toBeNull();
  });

  it('keeps significant digits of powers across decades (Number.prototype.toPrecision)', () => {
    expect(roundSignificant(123456.789, 4)).toBe(123500);
    expect(roundSignificant(0.000123456, 4)).toBe(0.0001235);
    expect(roundSignificant(3.14159, 4)).toBe(3.142);
  });
});

describe('trial raster', () => {
  const summary = {
    task: { rasterTrials: 2, rasterPoints: 3, trialOnsetsS: [5, 9], curveChannels: [] },
  } as unknown as RunSummary;

  it('sends trials × points row after row, rounded to 0.01 Hz, with NaN as null', () => {
    const raster = trialRasterOf(summary, {
      raster: Float64Array.of(9.123, 10.005, 11, Number.NaN, 12.3456, 8),
      'raster:timeS': Float64Array.of(-1, 0.5, 2),
      trialDeltaFHz: Float64Array.of(-0.512345, Number.NaN),
    });
    expect(raster).toEqual({
      timeS: [-1, 0.5, 2],
      trialOnsetsS: [5, 9],
      trialDeltaFHz: [-0.5123, null],
      trials: 2,
      points: 3,
      // The double nearest 10.005 is 10.00500000000000078… (IEEE 754), so it rounds up.
      valuesHz: [9.12, 10.01, 11, null, 12.35, 8],
    });
  });

  it('refuses a stored raster that does not fill trials × points rather than shift its rows', () => {
    expect(() =>
      trialRasterOf(summary, {
        raster: Float64Array.of(1, 2, 3, 4, 5),
        'raster:timeS': Float64Array.of(-1, 0.5, 2),
      }),
    ).toThrow('results: the raster holds 5 values, expected 2 × 3');
  });

  it('has no raster for a run without task results', () => {
    expect(trialRasterOf({ task: null } as unknown as RunSummary, {})).toBeNull();
  });
});
