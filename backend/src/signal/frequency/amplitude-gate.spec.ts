import { DEFAULT_ANALYSIS_SETTINGS } from '../pipeline/analysis-settings';
import { analyzeRecording } from '../pipeline/analyze-recording';
import {
  HALF_HERTZ_SLOWING_TASK,
  syntheticTaskFrequencyHz,
  syntheticTaskRecording,
  SyntheticTaskOptions,
} from '../synthetic/synthetic-eeg';
import { gateByAmplitude, midpointEnvelope, percentileOf } from './amplitude-gate';
import { frequencySliding } from './frequency-sliding';

describe('amplitude gate pieces', () => {
  it('reads percentiles as numpy.percentile does (linear, its default)', () => {
    const values = Float64Array.of(3.5, 1.0, 7.25, 2.0, 9.0, 4.0, 10.5, 6.0, 8.0, 5.5);
    // Expected values printed by numpy 2.4: numpy.percentile(values, p) for each p.
    const numpy: [number, number][] = [
      [0, 1.0],
      [10, 1.9],
      [25, 3.625],
      [50, 5.75],
      [90, 9.149999999999999],
      [100, 10.5],
    ];
    for (const [p, expected] of numpy) {
      expect(percentileOf(values, p)).toBeCloseTo(expected, 12);
    }
    expect(() => percentileOf(values, 101)).toThrow(/0 to 100, got 101/);
  });

  it('gives each frequency value the mean envelope of its two samples', () => {
    // |3+4i| = 5, |0+1i| = 1, |−6+8i| = 10 (closed form).
    const z = { re: Float64Array.of(3, 0, -6), im: Float64Array.of(4, 1, 8) };
    expect(Array.from(midpointEnvelope(z, new Float64Array(2)))).toEqual([3, 5.5]);
  });

  it('leaves out exactly the values under the percentile and counts them', () => {
    const frequency = Float64Array.from({ length: 8 }, (_, i) => 10 + i / 10);
    const envelope = Float64Array.of(5, 1, 4, 8, 2, 7, 3, 6);
    // 25th percentile of 1…8 = 1 + 0.25·7 = 2.75 (numpy's linear rule): 1 and 2 are under it.
    const count = gateByAmplitude(frequency, envelope, 25);
    expect(count).toEqual({ percentile: 25, excludedSamples: 2, totalSamples: 8 });
    expect(Array.from(frequency, (f) => Number.isNaN(f))).toEqual([
      false,
      true,
      false,
      false,
      true,
      false,
      false,
      false,
    ]);
  });
});

// Generated bursting alpha (synthetic-eeg.ts, alpha-bursts.ts): 10 Hz, 9.5 Hz from +0.2 to
// +0.8 s after each onset (Δf = −0.5 Hz by construction), in bursts of 0.75–2.25 s with
// pauses as long, where only 5 % of the alpha amplitude is left under 3 µV of noise.
const bursting: SyntheticTaskOptions = {
  ...HALF_HERTZ_SLOWING_TASK,
  bursts: { meanBurstS: 1.5, meanPauseS: 1.5 },
};
const onsetsS = bursting.onsetsS;
const recording = syntheticTaskRecording(bursting);
/** The gate's percentile when a study switches it on (DEFAULT_AMPLITUDE_GATE_PERCENTILE_WHEN_ON in @gyre/shared). */
const PERCENTILE_WHEN_ON = 25;

describe('amplitude gate on generated bursting alpha with a known frequency course', () => {
  it('brings the frequency series closer to the truth where it still gives a value', () => {
    const fs = bursting.sampleRateHz;
    const samples = recording.signals[0].samples;
    const options = { sampleRateHz: fs, bandHz: [8, 13] as const };
    const plain = frequencySliding(samples, options).frequencyHz;
    const gated = frequencySliding(samples, {
      ...options,
      amplitudeGatePercentile: PERCENTILE_WHEN_ON,
    });
    const meanAbsError = (series: Float64Array): number => {
      let sum = 0;
      let count = 0;
      // 3 s from each end left out: the filter's edges are not what the gate is about.
      for (let i = 3 * fs; i < series.length - 3 * fs; i++) {
        if (Number.isNaN(series[i])) continue;
        sum += Math.abs(series[i] - syntheticTaskFrequencyHz((i + 0.5) / fs, bursting));
        count++;
      }
      return sum / count;
    };
    const errorPlain = meanAbsError(plain);
    const errorGated = meanAbsError(gated.frequencyHz);
    // Figures in docs/method.md ("Amplitude gate"): 0.38 Hz without, 0.26 Hz with.
    expect(errorGated).toBeLessThan(0.75 * errorPlain);
    expect(gated.amplitudeGate?.excludedSamples).toBe(
      gated.frequencyHz.filter((f) => Number.isNaN(f)).length,
    );
    expect(gated.amplitudeGate?.totalSamples).toBe(samples.length - 1);
    expect(frequencySliding(samples, options).amplitudeGate).toBeNull();
  });

  it('brings the region of interest Δf and the trial Δf values closer to −0.5 Hz', () => {
    const run = (percentile: number | null) =>
      analyzeRecording(
        recording,
        {
          ...DEFAULT_ANALYSIS_SETTINGS,
          roi: ['O1', 'O2', 'Pz'],
          amplitudeGatePercentile: percentile,
        },
        { kind: 'task', iafHz: null },
      );
    const errors = (result: ReturnType<typeof run>) => {
      const roi = result.roi;
      if (roi === null) throw new Error('no region of interest');
      let squares = 0;
      roi.trialPostHz.forEach((post, k) => (squares += (post - roi.trialBaselineHz[k] + 0.5) ** 2));
      return {
        deltaF: Math.abs((roi.deltaFHz as number) + 0.5),
        trialRms: Math.sqrt(squares / roi.trialsKept),
      };
    };
    const plain = run(null);
    const gated = run(PERCENTILE_WHEN_ON);
    const off = errors(plain);
    const on = errors(gated);
    // Figures in docs/method.md: |Δf error| 0.125 → 0.041 Hz, trial RMS 0.43 → 0.39 Hz.
    expect(on.deltaF).toBeLessThan(off.deltaF);
    expect(on.trialRms).toBeLessThan(off.trialRms);
    for (const channel of gated.channels) {
      expect(channel.amplitudeGate?.percentile).toBe(PERCENTILE_WHEN_ON);
      // The 25th percentile leaves out a quarter of the values, to the sample.
      const gate = channel.amplitudeGate;
      expect(
        Math.abs((gate?.excludedSamples ?? 0) / (gate?.totalSamples ?? 1) - 0.25),
      ).toBeLessThan(1e-3);
    }
    // The curve leaves gated values out point by point: every point still has a mean.
    expect(Array.from(gated.roi?.curve.meanHz ?? []).every(Number.isFinite)).toBe(true);
    expect(plain.channels.every((c) => c.amplitudeGate === null)).toBe(true);
    expect(plain.roi?.dropReasons).toEqual({ edge: 0, amplitude: 0, artefact: 0 });
  });

  it('drops a trial left without any value in a window, with its own reason', () => {
    const result = analyzeRecording(
      recording,
      { ...DEFAULT_ANALYSIS_SETTINGS, roi: ['O1', 'O2', 'Pz'], amplitudeGatePercentile: 60 },
      { kind: 'task', iafHz: null },
    );
    const roi = result.roi;
    const gatedDrops = roi?.dropReasons.amplitudeGate ?? 0;
    expect(gatedDrops).toBeGreaterThan(0);
    expect((roi?.trialsKept ?? 0) + gatedDrops).toBe(onsetsS.length);
    expect(Array.from(roi?.trialBaselineHz ?? []).every(Number.isFinite)).toBe(true);
    expect(Number.isFinite(roi?.deltaFHz)).toBe(true);
  });
});
