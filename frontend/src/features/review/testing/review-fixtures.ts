import type {
  AnalysisRunView,
  AnalysisSettingsView,
  OnsetCurveView,
  ParticipantView,
  RecordingView,
  RecordingResultsView,
  ReportView,
  RoiUsageView,
  TrialRasterView,
  VisitAnalysisOverrideView,
  VisitFlagView,
  VisitReviewStateView,
  VisitView,
} from '@gyre/shared';
import { DEFAULT_SETTINGS, readyRecording, STUDY, SITE } from '../../../test/fixtures';

// Generated test data: one invented visit with a task and a resting recording.

export const PARTICIPANT: ParticipantView = {
  id: 'p-1',
  studyId: STUDY.id,
  siteId: SITE.id,
  code: 'AC-0042',
  enrolmentDate: null,
  groupId: null,
  createdAt: '2025-01-06T09:00:00.000Z',
  updatedAt: '2025-01-06T09:00:00.000Z',
};

export const VISIT: VisitView = {
  id: 'v-1',
  participantId: PARTICIPANT.id,
  studyId: STUDY.id,
  siteId: SITE.id,
  label: 'Baseline visit',
  visitDate: '2025-02-03',
  plannedVisitId: null,
  schedule: {
    plannedVisitId: null,
    plannedVisitName: null,
    studyDay: null,
    targetDay: null,
    daysFromTarget: null,
    window: 'unplanned',
  },
  createdAt: '2025-02-03T09:00:00.000Z',
  updatedAt: '2025-02-03T09:00:00.000Z',
};

/** Every region-of-interest channel used (the file's labels, as the server reports them). */
export const COMPLETE_ROI: RoiUsageView = {
  wanted: ['O1', 'O2', 'Pz'],
  used: ['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF'],
  leftOut: [],
  status: 'complete',
};

/** O2 flat, so the region averages O1 and Pz only. */
export const PARTIAL_ROI: RoiUsageView = {
  wanted: ['O1', 'O2', 'Pz'],
  used: ['EEG O1-REF', 'EEG Pz-REF'],
  leftOut: [{ label: 'EEG O2-REF', reason: 'flat' }],
  status: 'partial',
};

/** No region channel left: O1 and Pz saturated, O2 flat. */
export const NO_ROI: RoiUsageView = {
  wanted: ['O1', 'O2', 'Pz'],
  used: [],
  leftOut: [
    { label: 'EEG O1-REF', reason: 'saturated' },
    { label: 'EEG O2-REF', reason: 'flat' },
    { label: 'EEG Pz-REF', reason: 'saturated' },
  ],
  status: 'none',
};

export function recording(kind: 'task' | 'resting', runId: string): RecordingView {
  return readyRecording({
    id: `rec-${kind}`,
    participantId: PARTICIPANT.id,
    visitId: VISIT.id,
    kind,
    sizeBytes: 1_000_000,
    fileName: `${kind}.edf`,
    latestRunId: runId,
    roiUsage: COMPLETE_ROI,
    createdAt: '2025-02-03T10:00:00.000Z',
    updatedAt: '2025-02-03T10:05:00.000Z',
  });
}

export const RECORDINGS: RecordingView[] = [
  recording('task', 'run-task'),
  recording('resting', 'run-rest'),
];

function run(kind: 'task' | 'resting'): AnalysisRunView {
  return {
    id: kind === 'task' ? 'run-task' : 'run-rest',
    recordingId: `rec-${kind}`,
    visitId: VISIT.id,
    participantId: PARTICIPANT.id,
    kind,
    settingsId: 'set-1',
    settingsVersion: 1,
    codeVersion: 'test',
    inputChecksumSha256: 'a'.repeat(64),
    bandHz: [8, 13],
    bandSource: 'default',
    roiDeltaFHz: kind === 'task' ? -0.3125 : null,
    roiCiHz: kind === 'task' ? [-0.45, -0.18] : null,
    roiPValue: kind === 'task' ? 0.0004 : null,
    trialsKept: kind === 'task' ? 3 : null,
    trialsTotal: kind === 'task' ? 4 : null,
    pafHz: kind === 'resting' ? 10.236 : null,
    cogHz: kind === 'resting' ? 10.104 : null,
    suggestsSlowing: kind === 'task' ? true : null,
    trigger: 'upload',
    roiUsage: COMPLETE_ROI,
    overrideRevision: null,
    depthSettings: {
      amplitudeGatePercentile: null,
      cycleDisagreementHz: 0.1,
      compareConditions: null,
    },
    staleSettings: [],
    createdAt: '2025-02-03T10:05:00.000Z',
  };
}

function source(kind: 'task' | 'resting'): RecordingResultsView['source'] {
  return {
    recordingId: `rec-${kind}`,
    kind,
    uploadedAt: '2025-02-03T10:00:00.000Z',
    checksumSha256: kind === 'task' ? 'c0ffee'.repeat(10) + 'abcd' : 'b'.repeat(64),
    replacesId: null,
    replacementReason: null,
  };
}

const quality = {
  durationS: 300,
  sampleRatesHz: [256],
  roiChannelsFound: ['O1', 'O2', 'Pz'],
  roiChannelsMissing: [],
  flatChannels: [],
  saturatedChannels: [],
  lineNoiseRatio50Hz: 1.2,
  lineNoiseRatio60Hz: 1.0,
  epochsDroppedShare: 0.25,
  phaseSlipShare: 0.02,
  alphaPeakProminenceDb: 6.5,
  channels: [],
  warnings: [],
};

const timeS = [-1, -0.5, -0.25, 0, 0.25, 0.5, 1, 2];
const curve = (name: string, shift: number) => ({
  name,
  meanHz: timeS.map((t) => (t > 0.1 && t < 1 ? 9.7 : 10) + shift),
  ciLowHz: timeS.map((t) => (t > 0.1 && t < 1 ? 9.5 : 9.8) + shift),
  ciHighHz: timeS.map((t) => (t > 0.1 && t < 1 ? 9.9 : 10.2) + shift),
});

export const TASK_RESULTS: RecordingResultsView = {
  run: run('task'),
  source: source('task'),
  channels: [
    {
      label: 'EEG O1-REF',
      canonical: 'O1',
      inRoi: true,
      baselineHz: 10.01,
      postHz: 9.65,
      deltaFHz: -0.36,
      ciHz: [-0.5, -0.2],
      pValue: 0.002,
      trials: 3,
      pafHz: null,
      cogHz: null,
      amplitudeGate: null,
    },
    {
      label: 'EEG O2-REF',
      canonical: 'O2',
      inRoi: true,
      baselineHz: 10.05,
      postHz: 9.8,
      deltaFHz: -0.25,
      ciHz: [-0.45, -0.05],
      pValue: 0.02,
      trials: 3,
      pafHz: null,
      cogHz: null,
      amplitudeGate: null,
    },
    {
      label: 'EEG Fz-REF',
      canonical: 'Fz',
      inRoi: false,
      baselineHz: 9.9,
      postHz: 9.95,
      deltaFHz: 0.05,
      ciHz: [-0.1, 0.2],
      pValue: 0.41,
      trials: 3,
      pafHz: null,
      cogHz: null,
      amplitudeGate: null,
    },
    {
      label: 'EEG Pz-REF',
      canonical: 'Pz',
      inRoi: true,
      baselineHz: 10.2,
      postHz: 9.98,
      deltaFHz: -0.22,
      ciHz: [-0.4, -0.05],
      pValue: 0.03,
      trials: 2,
      pafHz: null,
      cogHz: null,
      amplitudeGate: null,
    },
  ],
  task: {
    timeS,
    baselineWindowS: [-0.5, 0],
    postWindowS: [0.2, 0.8],
    roi: curve('ROI', 0),
    curveChannels: ['EEG O1-REF', 'EEG O2-REF'],
    raster: { trials: 4, points: timeS.length },
    epochs: { total: 4, kept: 3, dropped: { amplitude: 1 } },
    conditions: [],
    conditionCurves: [],
    conditionDifference: null,
    cycles: null,
  },
  rest: null,
  quality,
};

/** `GET /api/recordings/rec-task/results/raster`: 4 trials × 8 points, one trial all dropped. */
export const TASK_RASTER: TrialRasterView = {
  timeS,
  trialOnsetsS: [10, 20, 30, 40],
  trialDeltaFHz: [-0.3, -0.2, null, -0.4],
  trials: 4,
  points: timeS.length,
  valuesHz: [
    ...timeS.map(() => 9),
    ...timeS.map(() => 10),
    ...timeS.map(() => null),
    ...timeS.map(() => 12),
  ],
};

/** `GET /api/recordings/rec-task/results/curves?channel=`: each channel's own curve. */
export const CHANNEL_CURVES: Record<string, OnsetCurveView> = {
  'EEG O1-REF': curve('EEG O1-REF', 0.05),
  'EEG O2-REF': curve('EEG O2-REF', -0.4),
};

const frequencyHz = Array.from({ length: 81 }, (_, i) => i * 0.5);
export const REST_RESULTS: RecordingResultsView = {
  run: run('resting'),
  source: source('resting'),
  channels: [],
  task: null,
  rest: {
    frequencyHz,
    powerUv2PerHz: frequencyHz.map((f) => 10 / (f + 1) + 5 * Math.exp(-((f - 10.2) ** 2))),
    pafHz: 10.236,
    cogHz: 10.104,
    prominenceDb: 6.5,
    noPeakReason: null,
    alphaWindowHz: [7, 13],
  },
  quality,
};

export const SETTINGS: AnalysisSettingsView = DEFAULT_SETTINGS;

export const NO_FLAG: VisitFlagView = {
  visitId: VISIT.id,
  current: null,
  suggestion: {
    suggestsSlowing: true,
    runId: 'run-task',
    roiDeltaFHz: -0.3125,
    roiCiHz: [-0.45, -0.18],
    flagThresholdHz: -0.2,
    roiUsage: COMPLETE_ROI,
  },
  history: [],
};

export const NO_OVERRIDE: VisitAnalysisOverrideView = {
  visitId: VISIT.id,
  revision: 0,
  roi: null,
  bandHz: null,
  onsetLabel: null,
  reason: null,
  updatedById: null,
  updatedAt: null,
};

export const REPORT: ReportView = {
  id: 'rep-1',
  visitId: VISIT.id,
  participantId: PARTICIPANT.id,
  siteId: SITE.id,
  state: 'draft',
  createdAt: '2025-02-03T10:05:00.000Z',
  updatedAt: '2025-02-03T10:05:00.000Z',
};

/** The visit's results, not yet reviewed by anyone (fingerprint invented). */
export const NOT_REVIEWED: VisitReviewStateView = {
  visitId: VISIT.id,
  currentFingerprint: '5'.repeat(64),
  currentRunIds: ['resting:run-rest', 'task:run-task'],
  latest: null,
  reviewed: false,
  changedSinceReview: false,
  canReview: true,
  cannotReviewReason: null,
};
