import { DEFAULT_ANALYSIS_SETTINGS } from '../pipeline/analysis-settings';
import { analyzeRecording } from '../pipeline/analyze-recording';
import { alphaBurstEnvelope, alphaWave } from '../synthetic/alpha-bursts';
import {
  HALF_HERTZ_SLOWING_TASK,
  syntheticTaskRecording,
  SyntheticTaskOptions,
} from '../synthetic/synthetic-eeg';
import { DEFAULT_BURST_THRESHOLDS, detectBursts } from './burst-detection';
import { channelCycleTrials, ChannelCycleTrials, cyclesOfChannel } from './channel-cycles';
import { cycleEstimate } from './cycle-estimate';
import { findCycles } from './cycle-features';

const TWO_PI = 2 * Math.PI;

describe('findCycles', () => {
  it('finds trough-to-trough periods of a sharp-peaked 10 Hz wave to within 0.1 %', () => {
    // Generated: the three-harmonic sawtooth of alpha-bursts.ts at exactly 10 Hz, 500 Hz rate.
    const fs = 500;
    const n = 5 * fs;
    const broad = Float64Array.from({ length: n }, (_, i) =>
      alphaWave((TWO_PI * 10 * i) / fs, 'sawtooth'),
    );
    const narrow = Float64Array.from({ length: n }, (_, i) => Math.sin((TWO_PI * 10 * i) / fs));
    const cycles = findCycles(narrow, broad, fs);
    expect(cycles.count).toBeGreaterThanOrEqual(48);
    for (let c = 0; c < cycles.count; c++) {
      // Closed form: one period of a 10 Hz wave is 0.1 s.
      expect(Math.abs(cycles.periodS[c] - 0.1)).toBeLessThan(1e-4);
      // Three harmonics leave ripples on the slow decay: most steps, not all, are monotonic.
      expect(cycles.monotonicity[c]).toBeGreaterThan(DEFAULT_BURST_THRESHOLDS.monotonicity);
      // The steep rise of this sawtooth: its peak lies in the first half of the cycle.
      expect(cycles.peak[c] - cycles.startTrough[c]).toBeLessThan(
        (cycles.endTrough[c] - cycles.startTrough[c]) / 2,
      );
    }
    const burst = detectBursts(cycles);
    // Every cycle but the two ends (no neighbour) passes: a steady rhythm is one burst.
    expect(Array.from(burst.subarray(1, cycles.count - 1)).every((b) => b === 1)).toBe(true);
    expect(burst[0]).toBe(0);
  });

  it('refuses copies of different lengths', () => {
    expect(() => findCycles(new Float64Array(10), new Float64Array(9), 250)).toThrow(
      /expected 10 samples like narrowBand, got 9/,
    );
  });
});

describe('detectBursts on generated bursting alpha', () => {
  it('keeps the cycles inside bursts and leaves out those of the pauses', () => {
    const fs = 250;
    const n = 120 * fs;
    const envelope = alphaBurstEnvelope(n, fs, { meanBurstS: 1.5, meanPauseS: 1.5, seed: 5 });
    const options: SyntheticTaskOptions = {
      sampleRateHz: fs,
      durationS: 120,
      channelLabels: ['O1'],
      onsetsS: [],
      noiseUv: 3,
      bursts: { meanBurstS: 1.5, meanPauseS: 1.5, seed: 5 },
    };
    const samples = syntheticTaskRecording(options).signals[0].samples;
    const { cycles, burst } = cyclesOfChannel(samples, { sampleRateHz: fs, bandHz: [8, 13] });
    let inside = 0;
    let insideBurst = 0;
    let pause = 0;
    let pauseBurst = 0;
    for (let c = 0; c < cycles.count; c++) {
      const at = Math.round(cycles.centreS[c] * fs);
      if (envelope[at] === 1) {
        inside++;
        insideBurst += burst[c];
      } else if (envelope[at] < 0.1) {
        pause++;
        pauseBurst += burst[c];
      }
    }
    // Figures of this generated case: see docs/method.md ("Cycle-by-cycle cross-check").
    expect(insideBurst / inside).toBeGreaterThan(0.9);
    expect(pauseBurst / pause).toBeLessThan(0.2);
  });
});

// Generated non-sinusoidal alpha with a known period course (synthetic-eeg.ts): a sharp-peaked,
// asymmetric three-harmonic sawtooth at 10 Hz, at 9.5 Hz from +0.2 to +0.8 s after each onset
// (raised-cosine ramps of 0.2 s), so the baseline (−0.5…0 s) holds 10 Hz cycles and the post
// window (+0.2…+0.8 s) 9.5 Hz ones: Δf = −0.5 Hz by construction.
const sawtoothTask: SyntheticTaskOptions = { ...HALF_HERTZ_SLOWING_TASK, waveform: 'sawtooth' };
const onsetsS = sawtoothTask.onsetsS;

describe('cycle-by-cycle Δf on generated sharp-peaked alpha (Δf = −0.5 Hz by construction)', () => {
  const recording = syntheticTaskRecording(sawtoothTask);

  it('recovers 10 Hz, 9.5 Hz and Δf within 0.03 Hz on one channel', () => {
    const trials = channelCycleTrials(recording.signals[0].samples, {
      sampleRateHz: 250,
      bandHz: [8, 13],
      onsetsS,
      trials: onsetsS.map((_, i) => i),
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
    });
    const estimate = cycleEstimate([trials], {
      trials: onsetsS.map((_, i) => i),
      phaseDeltaFHz: -0.5,
      disagreementHz: 0.1,
      resamples: 2000,
      seed: 1,
    });
    expect(Math.abs((estimate.baselineHz as number) - 10)).toBeLessThan(0.03);
    expect(Math.abs((estimate.postHz as number) - 9.5)).toBeLessThan(0.03);
    expect(Math.abs((estimate.deltaFHz as number) + 0.5)).toBeLessThan(0.03);
    expect(estimate.trialsUsed).toBeGreaterThanOrEqual(55);
    const [low, high] = estimate.ciHz as [number, number];
    expect(low).toBeLessThan(-0.5 + 0.03);
    expect(high).toBeGreaterThan(-0.5 - 0.03);
  });

  it('gives the run its estimate beside the phase-based one, in agreement', () => {
    const result = analyzeRecording(
      recording,
      { ...DEFAULT_ANALYSIS_SETTINGS, roi: ['O1', 'O2', 'Pz'] },
      { kind: 'task', iafHz: null },
    );
    const cycles = result.cycles;
    expect(Math.abs((cycles?.deltaFHz as number) + 0.5)).toBeLessThan(0.03);
    expect(cycles?.trialsTotal).toBe(result.roi?.trialsKept);
    expect(cycles?.disagrees).toBe(false);
    expect(result.warnings.some((w) => w.includes('cycle-by-cycle'))).toBe(false);
  });
});

describe('cycle-by-cycle Δf on a generated pure sinusoid', () => {
  const recording = syntheticTaskRecording({ ...sawtoothTask, waveform: 'sine' });

  it('agrees with the phase-based estimate within the default 0.1 Hz', () => {
    const result = analyzeRecording(
      recording,
      { ...DEFAULT_ANALYSIS_SETTINGS, roi: ['O1', 'O2', 'Pz'] },
      { kind: 'task', iafHz: null },
    );
    const cycles = result.cycles;
    expect(cycles?.disagreementHz).not.toBeNull();
    expect(cycles?.disagreementHz as number).toBeLessThan(0.1);
    expect(cycles?.disagreementHz).toBeCloseTo(
      Math.abs((cycles?.deltaFHz as number) - (result.roi?.deltaFHz as number)),
      12,
    );
    expect(cycles?.disagrees).toBe(false);
    // A study that tolerates no difference at all is warned.
    const strict = analyzeRecording(
      recording,
      { ...DEFAULT_ANALYSIS_SETTINGS, roi: ['O1', 'O2', 'Pz'], cycleDisagreementHz: 0.001 },
      { kind: 'task', iafHz: null },
    );
    expect(strict.cycles?.disagrees).toBe(true);
    expect(strict.warnings.some((w) => w.startsWith('The cycle-by-cycle Δf differs'))).toBe(true);
  });
});

describe('cycleEstimate', () => {
  const trial = (values: number[]): Float64Array => Float64Array.from(values);
  const channel = (baseline: number[], post: number[]): ChannelCycleTrials => ({
    baselineHz: trial(baseline),
    postHz: trial(post),
    cycles: Int32Array.of(10, 10, 10),
    burstCycles: Int32Array.of(5, 10, 0),
  });

  it('averages channels per trial, skips trials without both windows and compares', () => {
    const estimate = cycleEstimate(
      [channel([10, 10, NaN], [9, NaN, 9]), channel([11, 10, NaN], [10, 9.5, NaN])],
      { trials: [0, 1, 2], phaseDeltaFHz: -0.5, disagreementHz: 0.1, resamples: 200, seed: 1 },
    );
    // Closed form: trial 0: baseline (10 + 11)/2 = 10.5, post 9.5, Δf −1; trial 1: 10 → 9.5,
    // Δf −0.5; trial 2 has no baseline. Mean Δf −0.75; |−0.75 − (−0.5)| = 0.25 > 0.1.
    expect(estimate.baselineHz).toBeCloseTo(10.25, 12);
    expect(estimate.postHz).toBeCloseTo(9.5, 12);
    expect(estimate.deltaFHz).toBeCloseTo(-0.75, 12);
    expect(estimate.trialsUsed).toBe(2);
    expect(estimate.trialsTotal).toBe(3);
    expect(estimate.burstCycleShare).toBeCloseTo(30 / 60, 12);
    expect(estimate.disagreementHz).toBeCloseTo(0.25, 12);
    expect(estimate.disagrees).toBe(true);
  });

  it('has no estimate without trials', () => {
    const estimate = cycleEstimate([], {
      trials: [],
      phaseDeltaFHz: null,
      disagreementHz: 0.1,
      resamples: 200,
      seed: 1,
    });
    expect(estimate).toEqual({
      baselineHz: null,
      postHz: null,
      deltaFHz: null,
      ciHz: null,
      trialsUsed: 0,
      trialsTotal: 0,
      burstCycleShare: null,
      disagreementHz: null,
      disagrees: false,
    });
  });
});
