import { AGREEMENT_TOLERANCE_HZ, BenchCase, judgeCase } from './bench-results';
import type { GyreRun } from './gyre-whole-path';
import type { ScipyRun } from './scipy-pipeline';
import { parseBenchArguments } from './whole-path-bench';

function gyreRun(wallS: number, cpuS: number, peakBytes: number, deltaFHz: number): GyreRun {
  const stage = { wallS, cpuS };
  return {
    stages: { upload: stage, validation: stage, computation: stage, total: stage },
    answerS: 1,
    readyObservedS: wallS,
    server: { peakBytes, idleBytes: 1e8, polls: 10, cpuPerPollS: 0.005 },
    client: { cpuS: 1, peakBytes: 1e8 },
    fileBytes: 2.2e8,
    recordingState: 'ready',
    roi: { deltaFHz, ciHz: null, pValue: null, trialsKept: 880, trialsTotal: 898 },
  };
}

function scipyRun(processes: 1 | 2, wallS: number, cpuS: number, deltaFHz: number): ScipyRun {
  const roi = { deltaFHz, ciHz: null, pValue: null, trialsKept: 880, channels: [] };
  return {
    python: '3',
    numpy: '2',
    scipy: '1',
    processes,
    channels: 64,
    onsets: 898,
    wallS,
    cpuS,
    stepWallS: {},
    stepCpuS: {},
    peakRssMb: { processMb: 800 },
    roi: { ...roi, baselineHz: 10, postHz: 9.4 },
    channelResults: [],
  };
}

function benchCase(gyre: GyreRun, scipy1: ScipyRun, scipy2: ScipyRun): BenchCase {
  return {
    minutes: 60,
    channels: 64,
    rateHz: 500,
    fileBytes: 2.2e8,
    onsets: 898,
    writeS: 1,
    loadAverageBefore: [0, 0, 0],
    loadAverageAfter: [0, 0, 0],
    gyre,
    scipy1,
    scipy2,
    runs: { gyreWallS: [], scipy1WallS: [], scipy2WallS: [] },
  };
}

describe('judging a benchmark case against the issue’s targets', () => {
  it('holds exactly at the limits: 0.30×, 0.60×, 0.45× and 10⁹ bytes', () => {
    // Closed form: 30/100 = 0.30, 30/50 = 0.60, 45/100 = 0.45.
    const j = judgeCase(
      benchCase(
        gyreRun(30, 45, 1e9, -0.6),
        scipyRun(1, 100, 100, -0.6),
        scipyRun(2, 50, 110, -0.6),
      ),
    );
    expect(j.ratios.wallVsScipy1).toBeCloseTo(0.3, 12);
    expect(j.ratios.wallVsScipy2).toBeCloseTo(0.6, 12);
    expect(j.ratios.cpuVsScipy1).toBeCloseTo(0.45, 12);
    expect(j.targets.map((t) => t.holds)).toEqual([true, true, true, true]);
    expect(j.agreement.agree).toBe(true);
  });

  it('misses each target just beyond its limit, and says so', () => {
    const j = judgeCase(
      benchCase(
        gyreRun(30.1, 45.1, 1e9 + 1, -0.6),
        scipyRun(1, 100, 100, -0.6),
        scipyRun(2, 50, 110, -0.6),
      ),
    );
    expect(j.targets.map((t) => t.holds)).toEqual([false, false, false, false]);
  });

  it('disagrees when the ROI Δf differ by more than the tolerance or trials differ', () => {
    const far = judgeCase(
      benchCase(
        gyreRun(30, 45, 1e9, -0.6),
        scipyRun(1, 100, 100, -0.6),
        scipyRun(2, 50, 110, -0.6 + 2 * AGREEMENT_TOLERANCE_HZ),
      ),
    );
    expect(far.agreement.agree).toBe(false);
    expect(far.agreement.differenceHz).toBeCloseTo(2 * AGREEMENT_TOLERANCE_HZ, 12);
    const trials = scipyRun(1, 100, 100, -0.6);
    trials.roi.trialsKept = 879;
    const fewer = judgeCase(
      benchCase(gyreRun(30, 45, 1e9, -0.6), trials, scipyRun(2, 50, 110, -0.6)),
    );
    expect(fewer.agreement.agree).toBe(false);
  });
});

describe('npm run bench arguments', () => {
  it('takes the issue’s defaults and the options given', () => {
    expect(parseBenchArguments([])).toMatchObject({
      minutes: [10, 60],
      repeat: 1,
      channels: 64,
      rateHz: 500,
    });
    expect(parseBenchArguments(['--minutes', '2', '--repeat', '3'])).toMatchObject({
      minutes: [2],
      repeat: 3,
    });
  });

  it('names the option and what it expects when the input is bad', () => {
    expect(() => parseBenchArguments(['--minutes', '10,x'])).toThrow(
      '--minutes: a positive number expected, got x',
    );
    expect(() => parseBenchArguments(['--repeat', '1.5'])).toThrow(
      '--repeat: a positive whole number expected, got 1.5',
    );
    expect(() => parseBenchArguments(['--fast'])).toThrow('unknown option --fast');
  });
});
