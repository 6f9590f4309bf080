import { VisitReportModel } from '../visit-report-model';

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
        roiChannelsMissing: [],
        flatChannels: ['T7'],
        saturatedChannels: [],
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
      },
      {
        kind: 'task',
        analysisRunId: '1c8e1b63-75b2-4a1d-9b54-0f4d3c2e6a21',
        settingsVersion: 3,
        codeVersion: '0.1.0+bee9d0a',
        inputChecksumSha256: 'b4e2d0f3c8e5169d7f2a3b0c4d8e6f9a1b2c3d4e5f6071829304a5b6c7d8e9f0',
      },
    ],
    supersedes: null,
    signature: null,
    ...overrides,
  };
}
