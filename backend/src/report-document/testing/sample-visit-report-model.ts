import type { RoiUsageView } from '@gyre/shared';
import {
  ProvenanceEntry,
  RecordingSource,
  TaskDepthSection,
  VisitReportModel,
} from '../visit-report-model';

/** Every wanted channel used: the ROI of the synthetic study. */
export const SAMPLE_COMPLETE_ROI: RoiUsageView = {
  wanted: ['O1', 'O2', 'Oz', 'Pz'],
  used: ['O1', 'O2', 'Oz', 'Pz'],
  leftOut: [],
  status: 'complete',
};

/** Three of five wanted channels used; one saturated, one not in the file. */
export const SAMPLE_PARTIAL_ROI: RoiUsageView = {
  wanted: ['O1', 'O2', 'Oz', 'Pz', 'POz'],
  used: ['O1', 'O2', 'Pz'],
  leftOut: [
    { label: 'Oz', reason: 'saturated' },
    { label: 'POz', reason: 'missing' },
  ],
  status: 'partial',
};

/** No wanted channel left, one for each reason. */
export const SAMPLE_NO_ROI: RoiUsageView = {
  wanted: ['O1', 'O2', 'Oz', 'Pz', 'POz'],
  used: [],
  leftOut: [
    { label: 'O1', reason: 'flat' },
    { label: 'O2', reason: 'saturated' },
    { label: 'Oz', reason: 'sample-rate' },
    { label: 'Pz', reason: 'excluded' },
    { label: 'POz', reason: 'missing' },
  ],
  status: 'none',
};

export const SAMPLE_REST_SOURCE: RecordingSource = {
  recordingId: '7a3e9c10-2b4d-4f6a-8c1e-5d9b0a7f3e21',
  uploadedAtIso: '2026-11-20T09:14:02.000Z',
  replacesId: null,
  replacementReason: null,
};

/** A task recording that replaced an earlier upload of the same visit. */
export const SAMPLE_TASK_SOURCE: RecordingSource = {
  recordingId: 'e41b07d2-9c5a-4e13-b6f8-2a0d3c7e9b54',
  uploadedAtIso: '2026-11-20T10:02:47.000Z',
  replacesId: '5c2f8a61-0d7e-4b39-a1c4-8e6f2b9d0a73',
  replacementReason: 'Wrong onset file attached to the first upload',
};

/** Gyre's defaults: gate off, 0.1 Hz cross-check threshold, the first two conditions. */
export const SAMPLE_DEPTH_SETTINGS: ProvenanceEntry['depthSettings'] = {
  amplitudeGatePercentile: null,
  cycleDisagreementHz: 0.1,
  compareConditions: null,
};

/** Two conditions, their difference, a disagreeing cross-check and a 25th-percentile gate. */
export const SAMPLE_TASK_DEPTH: TaskDepthSection = {
  conditions: [
    {
      label: 'Tone',
      trialsKept: 19,
      trialsTotal: 20,
      baselineHz: 10.12,
      postHz: 9.71,
      deltaFHz: -0.4123,
      ciHz: [-0.5832, -0.2411],
      pValue: 0.00021,
    },
    {
      label: 'Word',
      trialsKept: 19,
      trialsTotal: 20,
      baselineHz: 10.1,
      postHz: 9.94,
      deltaFHz: -0.1619,
      ciHz: [-0.3204, -0.0035],
      pValue: 0.0468,
    },
  ],
  conditionDifference: {
    first: 'Tone',
    second: 'Word',
    chosenBy: 'settings',
    differenceHz: -0.2504,
    ciHz: [-0.4811, -0.0207],
    pValue: 0.0312,
    permutations: 5000,
    seed: 20190815,
  },
  cycles: {
    baselineHz: 10.08,
    postHz: 9.94,
    deltaFHz: -0.1402,
    ciHz: [-0.2915, 0.0106],
    trialsUsed: 35,
    trialsTotal: 38,
    burstCycleShare: 0.584,
    disagreementHz: 0.1469,
    disagrees: true,
  },
  cycleDisagreementHz: 0.1,
  amplitudeGate: { percentile: 25, excludedSamples: 46_080, totalSamples: 184_320 },
};

/**
 * A generated (synthetic) report model for tests and previews: a 1/f spectrum with a
 * Gaussian alpha bump at 10.2 Hz, and an onset curve that dips by about 0.3 Hz after onset.
 * No person or recording stands behind it.
 */
export function sampleVisitReportModel(
  overrides: Partial<VisitReportModel> = {},
): VisitReportModel {
  const frequencyHz = Array.from({ length: 161 }, (_, k) => k * 0.25);
  const powerUv2PerHz = frequencyHz.map(
    (f) => 20 / Math.max(f, 0.5) + 12 * Math.exp(-((f - 10.2) ** 2) / (2 * 0.8 ** 2)),
  );
  const timeS = Array.from({ length: 301 }, (_, k) => Number((-1 + k * 0.01).toFixed(2)));
  const meanHz = timeS.map((t) =>
    t > 0.1 && t < 1 ? 10.1 - 0.3 * Math.sin((Math.PI * (t - 0.1)) / 0.9) : 10.1,
  );
  return {
    reportId: '6f1c2a9e-3b7d-4c1e-9a55-0d2f8e7b1c44',
    revision: 1,
    generatedAtIso: '2026-12-01T22:30:00.000Z',
    study: { name: 'Synthetic Ageing Cohort', code: 'SAC' },
    site: { name: 'North Clinic (synthetic)' },
    participantCode: 'P-0042',
    visit: { label: 'Month 6', date: '2026-11-20' },
    rest: {
      pafHz: 10.213,
      cogHz: 10.087,
      prominenceDb: 6.42,
      noPeakReason: null,
      alphaWindowHz: [7, 13],
      spectrum: { frequencyHz, powerUv2PerHz },
      roiUsage: SAMPLE_COMPLETE_ROI,
      source: SAMPLE_REST_SOURCE,
    },
    task: {
      deltaFHz: -0.2871,
      ciHz: [-0.4123, -0.1502],
      pValue: 0.00431,
      trialsKept: 38,
      trialsTotal: 40,
      droppedByReason: { edge: 0, amplitude: 2, artefact: 0 },
      bandHz: [8.2, 12.2],
      baselineWindowS: [-0.5, 0],
      postWindowS: [0.2, 0.8],
      onsetCurve: {
        timeS,
        meanHz,
        ciLowHz: meanHz.map((m) => m - 0.12),
        ciHighHz: meanHz.map((m) => m + 0.12),
      },
      roiUsage: SAMPLE_PARTIAL_ROI,
      source: SAMPLE_TASK_SOURCE,
    },
    quality: [
      {
        kind: 'resting',
        durationS: 300,
        sampleRatesHz: [256],
        roiChannelsFound: ['O1', 'O2', 'Oz', 'Pz'],
        roiChannelsMissing: ['POz', 'PO3', 'PO4', 'PO7', 'PO8', 'P3', 'P4'],
        flatChannels: [],
        saturatedChannels: [],
        lineNoiseRatio50Hz: 1.08,
        lineNoiseRatio60Hz: null,
        epochsDroppedShare: null,
        phaseSlipShare: null,
        alphaPeakProminenceDb: 6.42,
        warnings: [],
      },
      {
        kind: 'task',
        durationS: 420.5,
        sampleRatesHz: [256],
        roiChannelsFound: ['O1', 'O2', 'Oz', 'Pz'],
        roiChannelsMissing: ['POz'],
        flatChannels: ['T7'],
        saturatedChannels: ['Oz'],
        lineNoiseRatio50Hz: 3.4,
        lineNoiseRatio60Hz: null,
        epochsDroppedShare: 0.05,
        phaseSlipShare: 0.0213,
        alphaPeakProminenceDb: null,
        warnings: ['2 onsets fall in the last second of the recording.'],
      },
    ],
    flags: [
      {
        state: 'raised',
        raisedByName: 'Dana Analyst',
        raisedAtIso: '2026-12-01T21:00:00.000Z',
        raiseReason: 'Δf below threshold with a CI clear of zero; consistent over O1 and O2.',
        clearedByName: null,
        clearedAtIso: null,
        clearReason: null,
      },
    ],
    flagSuggestion: { suggestsSlowing: true, flagThresholdHz: -0.2 },
    provenance: [
      {
        kind: 'resting',
        analysisRunId: '0b7f0a52-64a1-4f0c-8a43-9e3c2b1d5f10',
        settingsVersion: 3,
        codeVersion: '0.1.0+bee9d0a',
        inputChecksumSha256: 'a3f1c9e2b7d4058c6e1f2a9b3c7d5e8f0a1b2c3d4e5f60718293a4b5c6d7e8f9',
        depthSettings: SAMPLE_DEPTH_SETTINGS,
      },
      {
        kind: 'task',
        analysisRunId: '1c8e1b63-75b2-4a1d-9b54-0f4d3c2e6a21',
        settingsVersion: 3,
        codeVersion: '0.1.0+bee9d0a',
        inputChecksumSha256: 'b4e2d0f3c8e5169d7f2a3b0c4d8e6f9a1b2c3d4e5f6071829304a5b6c7d8e9f0',
        depthSettings: SAMPLE_DEPTH_SETTINGS,
      },
    ],
    supersedes: null,
    signature: null,
    ...overrides,
  };
}
