import type { ConditionDifferenceView, ConditionStatsView, CycleEstimateView } from '@gyre/shared';
import type { AnalysisRun } from './analysis-run.entity';
import { toResultsView } from './analysis-runs.service';
import { encodeResultSeries } from './result-series-codec';
import { roundedResults } from './results-http-shape';
import { settingsJson } from './settings-values';
import { DEFAULT_ANALYSIS_SETTINGS } from '../signal/pipeline/analysis-settings';

// Generated test data: three conditions, the pair named by the study's settings.
const condition = (label: string, deltaFHz: number, trialsKept: number): ConditionStatsView => ({
  label,
  trialsKept,
  trialsTotal: 12,
  baselineHz: 9.9,
  postHz: 9.9 + deltaFHz,
  deltaFHz,
  ciHz: [deltaFHz - 0.2, deltaFHz + 0.2],
  pValue: 0.05,
});
const conditions = [
  condition('Faces', -0.3, 11),
  condition('Houses', 0.05, 12),
  condition('Noise', 0, 9),
];
const difference: ConditionDifferenceView = {
  first: 'Houses',
  second: 'Faces',
  chosenBy: 'settings',
  differenceHz: 0.35,
  ciHz: [0.1, 0.6],
  pValue: 0.011,
  permutations: 5000,
  seed: 20190815,
};
const cycles: CycleEstimateView = {
  baselineHz: 9.95,
  postHz: 9.8,
  deltaFHz: -0.15,
  ciHz: null,
  trialsUsed: 20,
  trialsTotal: 32,
  burstCycleShare: null,
  disagreementHz: null,
  disagrees: false,
};

/** A hand-built stored run: summary JSON and series blob as the worker stores them. */
function storedRun(
  task: Record<string, unknown>,
  series: Record<string, Float64Array>,
): AnalysisRun {
  const summary = {
    bandHz: [8, 13],
    bandSource: 'default',
    roiUsage: { wanted: ['O1'], used: ['O1'], leftOut: [], status: 'complete' },
    // A channel row as stored before PAF/CoG and the amplitude gate existed.
    channels: [{ label: 'O1', canonical: 'O1', inRoi: true, baselineHz: 10, postHz: 9.6 }],
    roi: null,
    task: {
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
      epochs: { total: 40, kept: 37, dropped: {} },
      trialOnsetsS: [],
      curveChannels: [],
      rasterTrials: 0,
      rasterPoints: 0,
      ...task,
    },
    rest: null,
    quality: { warnings: [] },
    suggestsSlowing: null,
  };
  return {
    id: 'run-1',
    recordingId: 'rec-1',
    visitId: 'visit-1',
    participantId: 'p-1',
    kind: 'task',
    // The settings the run was computed with: the pair the difference names, the gate at 25.
    settingsJson: settingsJson({
      ...DEFAULT_ANALYSIS_SETTINGS,
      amplitudeGatePercentile: 25,
      cycleDisagreementHz: 0.2,
      compareConditions: ['Houses', 'Faces'],
    }),
    summaryJson: JSON.stringify(summary),
    series: encodeResultSeries({ timeS: Float64Array.of(-0.5, 0, 0.5), ...series }),
  } as unknown as AnalysisRun;
}

const recording = {
  id: 'rec-1',
  kind: 'task' as const,
  createdAt: '2026-01-01T00:00:00.000Z',
  checksumSha256: 'a'.repeat(64),
  replacesId: null,
  replacementReason: null,
};

describe('results view: conditions, their curves and the cycle-by-cycle estimate', () => {
  const run = storedRun(
    {
      conditions,
      conditionDifference: difference,
      conditionCurves: ['Faces', 'Houses'],
      cycles,
    },
    {
      'condition:Faces:mean': Float64Array.of(10.123456, 9.98765, Number.NaN),
      'condition:Faces:ciLow': Float64Array.of(10, 9.8, Number.NaN),
      'condition:Faces:ciHigh': Float64Array.of(10.2, 10.1, Number.NaN),
      'condition:Houses:mean': Float64Array.of(10.05, 10.04, 10.03),
      'condition:Houses:ciLow': Float64Array.of(9.9, 9.9, 9.9),
      'condition:Houses:ciHigh': Float64Array.of(10.2, 10.2, 10.2),
    },
  );

  it('passes the stored conditions, the difference and the cycles through unchanged', () => {
    const task = toResultsView(run, recording, []).task;
    expect(task?.conditions).toEqual(conditions);
    expect(task?.conditionDifference).toEqual(difference);
    expect(task?.cycles).toEqual(cycles);
  });

  it("gives the run's own analysis-depth settings, read from its stored settings", () => {
    // What Review judges the cross-check by, whatever the study's settings say later.
    expect(toResultsView(run, recording, []).run.depthSettings).toEqual({
      amplitudeGatePercentile: 25,
      cycleDisagreementHz: 0.2,
      compareConditions: ['Houses', 'Faces'],
    });
  });

  it('reads each condition curve from its `condition:<label>:…` series, named by the label', () => {
    const task = toResultsView(run, recording, []).task;
    // "Noise" has no stored curve: only the labels the summary names are read.
    expect(task?.conditionCurves.map((c) => c.name)).toEqual(['Faces', 'Houses']);
    expect(task?.conditionCurves[0]).toEqual({
      name: 'Faces',
      meanHz: [10.123456, 9.98765, null],
      ciLowHz: [10, 9.8, null],
      ciHighHz: [10.2, 10.1, null],
    });
  });

  it('rounds the condition curves over HTTP as the region-of-interest curve (4 decimals)', () => {
    const sent = roundedResults(toResultsView(run, recording, []));
    // 10.123456 → 10.1235 and 9.98765 → 9.9877 (Number.prototype.toFixed(4) gives the same).
    expect(sent.task?.conditionCurves[0].meanHz).toEqual([10.1235, 9.9877, null]);
    expect(sent.task?.conditionCurves[1].meanHz).toEqual([10.05, 10.04, 10.03]);
  });

  it('reads a run stored before conditions existed as none, and its channels without a gate', () => {
    const view = toResultsView(storedRun({}, {}), recording, []);
    expect(view.task).toMatchObject({
      conditions: [],
      conditionCurves: [],
      conditionDifference: null,
      cycles: null,
    });
    expect(view.channels[0]).toMatchObject({ pafHz: null, cogHz: null, amplitudeGate: null });
  });
});
