import { compareCalibration, type CalibrationComputed } from './calibration-comparison';

const truth = { pafHz: 10, baselineHz: 10, deltaFHz: -0.5, trialsKept: 29 };
const tolerances = { pafHz: 0.125, baselineHz: 0.125, deltaFHz: 0.05 };

function computed(
  overrides: {
    pafHz?: number | null;
    baselineHz?: number | null;
    deltaFHz?: number | null;
    ciHz?: [number, number] | null;
    trialsKept?: number;
    roi?: null;
  } = {},
): CalibrationComputed {
  const roi =
    overrides.roi === null
      ? null
      : {
          baselineHz: overrides.baselineHz === undefined ? 10.003 : overrides.baselineHz,
          postHz: 9.5,
          deltaFHz: overrides.deltaFHz === undefined ? -0.503 : overrides.deltaFHz,
          ciHz:
            overrides.ciHz === undefined ? ([-0.505, -0.501] as [number, number]) : overrides.ciHz,
          pValue: 1e-8,
          trialsKept: overrides.trialsKept ?? 29,
          trialsTotal: 29,
        };
  return {
    rest: {
      rest: {
        pafHz: overrides.pafHz === undefined ? 9.9998 : overrides.pafHz,
        cogHz: 9.99,
        prominenceDb: 29,
        noPeakReason: null,
        alphaWindowHz: [7, 13],
      },
    },
    task: { roi },
  };
}

const verdicts = (c: CalibrationComputed) =>
  Object.fromEntries(compareCalibration(truth, tolerances, c).map((x) => [x.key, x.passed]));

describe('compareCalibration', () => {
  it('passes values within their tolerances and reports expected, computed and tolerance', () => {
    const checks = compareCalibration(truth, tolerances, computed());
    expect(checks.every((c) => c.passed)).toBe(true);
    expect(checks[0]).toEqual({
      key: 'restPafHz',
      unit: 'Hz',
      expected: 10,
      computed: 9.9998,
      tolerance: 0.125,
      passed: true,
    });
    // Δf: the floor plus the half-width of the run's 95 % interval (0.002 Hz here).
    expect(checks[2].tolerance).toBeCloseTo(0.052, 12);
  });

  it('fails a PAF one Welch bin off (0.25 Hz), and accepts one just inside half a bin', () => {
    expect(verdicts(computed({ pafHz: 10.25 })).restPafHz).toBe(false);
    expect(verdicts(computed({ pafHz: 9.876 })).restPafHz).toBe(true);
    expect(verdicts(computed({ pafHz: 9.874 })).restPafHz).toBe(false);
  });

  it('widens the Δf tolerance by a wide interval and fails outside it', () => {
    expect(verdicts(computed({ deltaFHz: -0.4 })).taskDeltaFHz).toBe(false);
    // Interval −0.6…−0.2 (half-width 0.2): tolerance 0.25, |−0.4 − (−0.5)| = 0.1 passes.
    expect(verdicts(computed({ deltaFHz: -0.4, ciHz: [-0.6, -0.2] })).taskDeltaFHz).toBe(true);
  });

  it('fails every missing value and a dropped trial', () => {
    const v = verdicts(computed({ pafHz: null, baselineHz: null, deltaFHz: null, trialsKept: 28 }));
    expect(v).toEqual({
      restPafHz: false,
      taskBaselineHz: false,
      taskDeltaFHz: false,
      taskTrialsKept: false,
    });
    const none = compareCalibration(truth, tolerances, computed({ roi: null }));
    expect(none.slice(1).map((c) => [c.computed, c.passed])).toEqual([
      [null, false],
      [null, false],
      [null, false],
    ]);
  });

  it('fails a NaN', () => {
    expect(verdicts(computed({ deltaFHz: Number.NaN })).taskDeltaFHz).toBe(false);
  });
});
