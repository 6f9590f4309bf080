import { syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { CONDITION_PERMUTATION_SEED, CONDITION_PERMUTATIONS } from '../trials/condition-statistics';
import { AnalysisSettings, DEFAULT_ANALYSIS_SETTINGS } from './analysis-settings';
import type { AnalysisContext, OnsetInput } from './analysis.types';
import { analyzeRecording } from './analyze-recording';
import { toAnalyzeOutcome } from './run-summary';

const settings = (changes: Partial<AnalysisSettings> = {}): AnalysisSettings => ({
  ...DEFAULT_ANALYSIS_SETTINGS,
  ...changes,
});

// Generated test data (synthetic-eeg.ts), known answers by construction: the alpha frequency
// is 10 Hz and dips by 0.5 Hz over +0.2…+0.8 s after each "Tone" onset only; the "Word"
// onsets, 4 s later, have no dip. So Δf(Tone) = −0.5 Hz, Δf(Word) = 0 Hz and their
// difference −0.5 Hz between the default baseline (−0.5…0 s) and post (+0.2…+0.8 s) windows.
const TRIALS = 24;
const toneS = Array.from({ length: TRIALS }, (_, i) => 3 + 8 * i);
const wordS = toneS.map((t) => t + 4);
const channelLabels = ['O1', 'O2', 'Pz', 'Cz'];
const durationS = 3 + 8 * TRIALS + 2;
const twoConditions = syntheticTaskRecording({
  sampleRateHz: 250,
  durationS,
  channelLabels,
  onsetsS: toneS,
  dipHz: -0.5,
  noiseUv: 3,
  seed: 11,
});
// Both conditions slow by the same −0.5 Hz: their difference is 0 by construction.
const sameSlowing = syntheticTaskRecording({
  sampleRateHz: 250,
  durationS,
  channelLabels,
  onsetsS: [...toneS, ...wordS],
  dipHz: -0.5,
  noiseUv: 3,
  seed: 12,
});
const onsets: OnsetInput[] = [
  ...toneS.map((onsetS, i) => ({ onsetS, label: i === 1 ? 'TONE' : 'Tone' })),
  ...wordS.map((onsetS) => ({ onsetS, label: 'Word' })),
];
const TASK: AnalysisContext = { kind: 'task', iafHz: null, onsets };

describe('conditions of a generated task recording (Δf −0.5 Hz vs 0 Hz by construction)', () => {
  const result = analyzeRecording(twoConditions, DEFAULT_ANALYSIS_SETTINGS, TASK);
  const conditions = result.roi?.conditions ?? [];

  it('finds each label once, case-insensitively, in order of first appearance', () => {
    expect(conditions.map((c) => c.label)).toEqual(['Tone', 'Word']);
    expect(conditions.map((c) => [c.trialsKept, c.trialsTotal])).toEqual([
      [TRIALS, TRIALS],
      [TRIALS, TRIALS],
    ]);
  });

  it('recovers each condition’s Δf within 0.05 Hz of the truth, with a small p only for Tone', () => {
    const [tone, word] = conditions;
    expect(Math.abs((tone.deltaFHz as number) + 0.5)).toBeLessThan(0.05);
    expect(Math.abs(word.deltaFHz as number)).toBeLessThan(0.05);
    expect((tone.ciHz as [number, number])[1]).toBeLessThan(0);
    expect(tone.pValue as number).toBeLessThan(0.001);
    const wordCi = word.ciHz as [number, number];
    expect(wordCi[0]).toBeLessThan(0.05);
    expect(wordCi[1]).toBeGreaterThan(-0.05);
  });

  it('gives the difference Tone − Word: the CI covers −0.5 Hz and excludes 0, p < 0.01', () => {
    const difference = result.roi?.conditionDifference;
    expect(difference).toMatchObject({ first: 'Tone', second: 'Word', chosenBy: 'first-two' });
    expect(Math.abs((difference?.differenceHz as number) + 0.5)).toBeLessThan(0.05);
    const [low, high] = difference?.ciHz as [number, number];
    expect(low).toBeLessThan(-0.5);
    expect(high).toBeGreaterThan(-0.5);
    expect(high).toBeLessThan(0);
    expect(difference?.pValue as number).toBeLessThan(0.01);
    // C(48, 24) splits outnumber the resamples: 5000 random ones with the fixed seed.
    expect(difference?.permutations).toBe(CONDITION_PERMUTATIONS);
    expect(difference?.seed).toBe(CONDITION_PERMUTATION_SEED);
  });

  it('stores the statistics in the run summary and each condition’s curve as a series', () => {
    const { summary, series } = toAnalyzeOutcome(result, []);
    expect(summary.task?.conditions.map((c) => c.label)).toEqual(['Tone', 'Word']);
    expect(summary.task?.conditions[0]).toEqual({
      label: 'Tone',
      trialsKept: TRIALS,
      trialsTotal: TRIALS,
      baselineHz: conditions[0].baselineHz,
      postHz: conditions[0].postHz,
      deltaFHz: conditions[0].deltaFHz,
      ciHz: conditions[0].ciHz,
      pValue: conditions[0].pValue,
    });
    expect(summary.task?.conditionDifference).toEqual(result.roi?.conditionDifference);
    expect(summary.task?.conditionCurves).toEqual(['Tone', 'Word']);
    for (const label of ['Tone', 'Word']) {
      for (const part of ['mean', 'ciLow', 'ciHigh']) {
        expect(series[`condition:${label}:${part}`]).toHaveLength(series.timeS.length);
      }
    }
    // The Tone curve dips to about 9.5 Hz inside the post window; the Word curve does not.
    const at = series.timeS.findIndex((t) => t >= 0.5);
    expect(Math.abs(series['condition:Tone:mean'][at] - 9.5)).toBeLessThan(0.1);
    expect(Math.abs(series['condition:Word:mean'][at] - 10)).toBeLessThan(0.1);
  });

  it('compares the pair the settings name, and a requested pair over it', () => {
    const reversed = analyzeRecording(
      twoConditions,
      settings({ compareConditions: ['word', 'tone'] }),
      TASK,
    );
    const fromSettings = reversed.roi?.conditionDifference;
    expect(fromSettings).toMatchObject({ first: 'Word', second: 'Tone', chosenBy: 'settings' });
    expect(fromSettings?.differenceHz).toBeCloseTo(
      -(result.roi?.conditionDifference?.differenceHz as number),
      12,
    );
    const requested = analyzeRecording(
      twoConditions,
      settings({ compareConditions: ['word', 'tone'] }),
      { ...TASK, compareConditions: ['Tone', 'Word'] },
    );
    expect(requested.roi?.conditionDifference).toMatchObject({
      first: 'Tone',
      second: 'Word',
      chosenBy: 'request',
    });
  });

  it('warns and gives no difference when a named condition has no trials', () => {
    const missing = analyzeRecording(
      twoConditions,
      settings({ compareConditions: ['Tone', 'Click'] }),
      TASK,
    );
    expect(missing.roi?.conditionDifference).toBeNull();
    expect(missing.roi?.conditions).toHaveLength(2);
    expect(missing.warnings).toContain(
      'Condition "Click" named for the difference has no trials (conditions found: "Tone", "Word").',
    );
  });
});

describe('conditions with the same slowing (difference 0 by construction)', () => {
  it('gives a difference near 0 with a p that is not small', () => {
    const result = analyzeRecording(sameSlowing, DEFAULT_ANALYSIS_SETTINGS, TASK);
    const difference = result.roi?.conditionDifference;
    for (const c of result.roi?.conditions ?? []) {
      expect(Math.abs((c.deltaFHz as number) + 0.5)).toBeLessThan(0.05);
    }
    expect(Math.abs(difference?.differenceHz as number)).toBeLessThan(0.05);
    const [low, high] = difference?.ciHz as [number, number];
    expect(low).toBeLessThan(0);
    expect(high).toBeGreaterThan(0);
    expect(difference?.pValue as number).toBeGreaterThan(0.05);
  });
});

describe('recordings with one label or none', () => {
  it('gives one condition and no difference for a single label', () => {
    const result = analyzeRecording(twoConditions, DEFAULT_ANALYSIS_SETTINGS, {
      kind: 'task',
      iafHz: null,
      onsets: toneS.map((onsetS) => ({ onsetS, label: 'stimulus' })),
    });
    expect(result.roi?.conditions.map((c) => c.label)).toEqual(['stimulus']);
    expect(result.roi?.conditionDifference).toBeNull();
    expect(result.warnings.filter((w) => w.startsWith('Condition'))).toEqual([]);
  });

  it('has no conditions in a resting run', () => {
    const rest = analyzeRecording(twoConditions, DEFAULT_ANALYSIS_SETTINGS, {
      kind: 'rest',
      iafHz: null,
    });
    expect(rest.roi).toBeNull();
    expect(toAnalyzeOutcome(rest, []).summary.task).toBeNull();
  });
});
