import 'reflect-metadata';
import { DEFAULT_ANALYSIS_SETTINGS } from '../signal/pipeline/analysis-settings';
import { analyzeRecording } from '../signal/pipeline/analyze-recording';
import { toAnalyzeOutcome } from '../signal/pipeline/run-summary';
import { HALF_HERTZ_SLOWING_TASK, syntheticTaskRecording } from '../signal/synthetic/synthetic-eeg';
import { encodeResultBody, parseResultBody } from './result-wire';

// The first 40 s of the generated half-hertz slowing task, analysed with the amplitude gate on.
const outcome = toAnalyzeOutcome(
  analyzeRecording(
    syntheticTaskRecording({
      ...HALF_HERTZ_SLOWING_TASK,
      durationS: 45,
      onsetsS: HALF_HERTZ_SLOWING_TASK.onsetsS.slice(0, 10),
    }),
    { ...DEFAULT_ANALYSIS_SETTINGS, roi: ['O1', 'O2', 'Pz'], amplitudeGatePercentile: 25 },
    { kind: 'task', iafHz: null },
  ),
  [],
);

type Body = {
  summary: {
    task: { cycles: Record<string, unknown> | null };
    channels: Array<{ amplitudeGate: Record<string, unknown> | null }>;
  };
};
const body = (): Body => JSON.parse(JSON.stringify(encodeResultBody(outcome, '1.2.3'))) as Body;

describe('the cycle-by-cycle estimate and the amplitude gate on the worker wire', () => {
  it('carries both as they were computed', () => {
    expect(outcome.summary.task?.cycles?.trialsTotal).toBe(10);
    expect(outcome.summary.channels[0].amplitudeGate?.percentile).toBe(25);
    const parsed = parseResultBody(body());
    expect(parsed.ok ? [] : parsed.problems).toEqual([]);
    if (parsed.ok)
      expect(parsed.outcome.summary.task?.cycles).toEqual(outcome.summary.task?.cycles);
  });

  it('refuses a malformed estimate or gate count with its path', () => {
    const sent = body();
    const cycles = sent.summary.task.cycles as Record<string, unknown>;
    cycles.burstCycleShare = 1.5;
    cycles.disagrees = 'yes';
    (sent.summary.channels[0].amplitudeGate as Record<string, unknown>).excludedSamples = -1;
    const parsed = parseResultBody(sent);
    expect(parsed.ok ? [] : parsed.problems).toEqual(
      expect.arrayContaining([
        'summary.task.cycles.burstCycleShare: must not be greater than 1',
        'summary.task.cycles.disagrees: must be a boolean value',
        'summary.channels.0.amplitudeGate.excludedSamples: must not be less than 0',
      ]),
    );
    const none = body();
    none.summary.task.cycles = null;
    const parsedNone = parseResultBody(none);
    expect(parsedNone.ok ? [] : parsedNone.problems).toEqual([]);
  });
});
