import { syntheticRestRecording, syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { outlineOf, planAnalysis } from './analysis-plan';
import { AnalysisSettings, DEFAULT_ANALYSIS_SETTINGS } from './analysis-settings';
import type { AnalysisContext, AnalysisRecording, AnalysisResult } from './analysis.types';
import { analyzeChannels, ChannelPart, channelPartBuffers } from './analyze-channels';
import { analyzeRecording } from './analyze-recording';
import { mergeChannelParts } from './merge-channel-parts';
import { bitExact } from './testing/bit-exact';

const settings = (changes: Partial<AnalysisSettings> = {}): AnalysisSettings => ({
  ...DEFAULT_ANALYSIS_SETTINGS,
  ...changes,
});

/** The channels of a plan dealt round-robin into `parts` parts (any split must do). */
function dealt(count: number, parts: number): number[][] {
  return Array.from({ length: parts }, (_, k) =>
    Array.from({ length: count }, (_, i) => i).filter((i) => i % parts === k),
  );
}

/** Plan, each part on its own, merge: what the server does across threads. */
function analyzeInParts(
  recording: AnalysisRecording,
  runSettings: AnalysisSettings,
  context: AnalysisContext,
  parts: number,
): AnalysisResult {
  const plan = planAnalysis(outlineOf(recording), runSettings, context);
  const results = dealt(plan.channels.length, parts).map((channels) =>
    analyzeChannels(
      { channels, signals: channels.map((i) => recording.signals[plan.channels[i].signalIndex]) },
      plan,
    ),
  );
  // Parts finish in any order: the merge must not care.
  return mergeChannelParts(plan, results.reverse());
}

// Generated test data (synthetic-eeg.ts): 10 Hz, 9.4 Hz over +0.2…+0.8 s after each onset,
// so Δf = −0.6 Hz by construction. O2 is made flat (left out of the region), P8 carries an
// unknown unit, ECG is no 10-10 electrode and is not analysed.
const onsetsS = Array.from({ length: 14 }, (_, i) => 3 + 4 * i);
const generated = syntheticTaskRecording({
  sampleRateHz: 250,
  durationS: 62,
  channelLabels: ['O1', 'O2', 'Oz', 'Pz', 'P8', 'Cz', 'ECG'],
  onsetsS,
  noiseUv: 3,
  seed: 21,
});
const task: AnalysisRecording = {
  ...generated,
  signals: generated.signals.map((s) =>
    s.label === 'O2'
      ? { ...s, samples: new Float32Array(s.samples.length) }
      : s.label === 'P8'
        ? { ...s, physicalDimension: 'furlong' }
        : s,
  ),
};
const rest = syntheticRestRecording({
  sampleRateHz: 250,
  durationS: 60,
  channelLabels: ['O1', 'O2', 'Oz', 'Cz'],
  peakHz: 10.4,
  seed: 5,
});

describe('analyzeChannels + mergeChannelParts give analyzeRecording to the bit', () => {
  const cases: Array<[string, AnalysisRecording, AnalysisSettings, AnalysisContext]> = [
    ['task, band-pass, default region', task, settings(), { kind: 'auto', iafHz: null }],
    [
      'task, Morlet around an IAF, own region',
      task,
      settings({ method: 'morlet', roi: ['O1', 'O2', 'Oz', 'Pz', 'P8'] }),
      { kind: 'task', iafHz: 9.8 },
    ],
    ['rest', rest, settings({ roi: ['O1', 'O2', 'Oz'] }), { kind: 'auto', iafHz: null }],
  ];

  describe.each(cases)('%s', (_name, recording, runSettings, context) => {
    const whole = analyzeRecording(recording, runSettings, context);

    it.each([1, 2, 3])('in %i part(s)', (parts) => {
      const split = analyzeInParts(recording, runSettings, context, parts);
      expect(bitExact(split)).toEqual(bitExact(whole));
    });
  });

  it('keeps what the whole run found (generated truth: Δf = −0.6 Hz; O2 flat; P8 in furlong)', () => {
    const split = analyzeInParts(task, settings(), { kind: 'auto', iafHz: null }, 3);
    // By construction (synthetic-eeg.ts): Δf = −0.6 Hz on every channel and the region.
    expect(Math.abs((split.roi?.deltaFHz as number) + 0.6)).toBeLessThan(0.05);
    expect(split.channels.map((c) => c.label)).toEqual(['O1', 'O2', 'Oz', 'Pz', 'P8', 'Cz']);
    expect(split.qc.flatChannels).toEqual(['O2']);
    expect(split.roi?.channels).toEqual(['O1', 'Oz', 'Pz']);
    expect(split.warnings).toContain('Unknown unit "furlong": amplitudes read as µV.');
  });

  it('keeps epochs only for region candidates, in buffers that can move whole', () => {
    const plan = planAnalysis(outlineOf(task), settings(), { kind: 'auto', iafHz: null });
    const channels = plan.channels.map((_, i) => i);
    const part = analyzeChannels(
      { channels, signals: plan.channels.map((c) => task.signals[c.signalIndex]) },
      plan,
    );
    // The default region (docs/method.md §1) holds O1, O2, Oz and Pz of these; flat O2 too,
    // as only the merge knows which candidates the region keeps.
    const kept = part.filter((c) => c.roiEpochs !== null);
    expect(kept.map((c) => plan.channels[c.index].label)).toEqual(['O1', 'O2', 'Oz', 'Pz']);
    const buffers = channelPartBuffers(part);
    expect(new Set(buffers).size).toBe(buffers.length);
    expect(structuredClone(part, { transfer: buffers })).toHaveLength(part.length);
  });

  it('refuses parts that miss a channel, repeat one or do not match the plan', () => {
    const plan = planAnalysis(outlineOf(task), settings(), { kind: 'auto', iafHz: null });
    const signalOf = (i: number): AnalysisRecording['signals'][number] =>
      task.signals[plan.channels[i].signalIndex];
    const first: ChannelPart[] = analyzeChannels(
      { channels: [0, 1], signals: [0, 1].map(signalOf) },
      plan,
    );
    expect(() => mergeChannelParts(plan, [first])).toThrow(/no result for Oz, Pz, P8, Cz/);
    expect(() => mergeChannelParts(plan, [first, first])).toThrow(/O1 came twice/);
    expect(() => analyzeChannels({ channels: [2], signals: [signalOf(3)] }, plan)).toThrow(
      /signal "Pz" at 250 Hz found for channel 2, "Oz" at 250 Hz expected/,
    );
  });
});
