import 'reflect-metadata';
import { DEFAULT_ANALYSIS_SETTINGS } from '../signal/pipeline/analysis-settings';
import { analyzeRecording } from '../signal/pipeline/analyze-recording';
import { toAnalyzeOutcome } from '../signal/pipeline/run-summary';
import { syntheticTaskRecording } from '../signal/synthetic/synthetic-eeg';
import { encodeResultBody, parseResultBody } from './result-wire';

// A generated task recording (synthetic-eeg.ts) with two conditions, as a worker posts it.
const onsetsS = Array.from({ length: 10 }, (_, i) => 3 + 4 * i);
const recording = syntheticTaskRecording({
  sampleRateHz: 250,
  durationS: 45,
  channelLabels: ['O1', 'O2'],
  onsetsS,
  seed: 3,
});
const outcome = toAnalyzeOutcome(
  analyzeRecording(recording, DEFAULT_ANALYSIS_SETTINGS, {
    kind: 'task',
    iafHz: null,
    onsets: onsetsS.map((onsetS, i) => ({ onsetS, label: i % 2 === 0 ? 'Tone' : 'Word' })),
  }),
  [],
);

type Body = {
  summary: { task: Record<string, unknown> & { conditions: Array<Record<string, unknown>> } };
  series: Record<string, string>;
};
const body = (): Body => JSON.parse(JSON.stringify(encodeResultBody(outcome, '1.2.3'))) as Body;
const conditionProblems = (sent: Body): string[] => {
  const parsed = parseResultBody(sent);
  return parsed.ok ? [] : parsed.problems.filter((p) => /condition/i.test(p));
};

describe('conditions on the worker wire', () => {
  it('carries the conditions, their difference and their curves', () => {
    expect(outcome.summary.task?.conditions.map((c) => c.label)).toEqual(['Tone', 'Word']);
    expect(outcome.summary.task?.conditionDifference?.first).toBe('Tone');
    expect(conditionProblems(body())).toEqual([]);
  });

  it('refuses a malformed condition or a missing condition curve with its path', () => {
    const sent = body();
    sent.summary.task.conditions[0].trialsKept = -1;
    (sent.summary.task.conditionDifference as Record<string, unknown>).chosenBy = 'guess';
    expect(conditionProblems(sent)).toEqual(
      expect.arrayContaining([
        'summary.task.conditions.0.trialsKept: must not be less than 0',
        expect.stringMatching(/^summary\.task\.conditionDifference\.chosenBy: must be one of/),
      ]),
    );
    const unsized = body();
    delete unsized.series['condition:Word:ciLow'];
    const parsed = parseResultBody(unsized);
    expect(parsed.ok ? [] : parsed.problems).toContain(
      'series.condition:Word:ciLow: missing (named in summary.task.conditionCurves)',
    );
  });
});
