import type {
  AmplitudeGateView,
  ConditionDifferenceView,
  ConditionStatsView,
  CycleEstimateView,
} from './analysis-depth';
/**
 * API types of recordings, background jobs, analysis settings, runs and results,
 * slowing flags, draft reports and participant trajectories.
 */

export const RECORDING_KINDS = ['resting', 'task'] as const;
export type RecordingKind = (typeof RECORDING_KINDS)[number];

/**
 * received → validating → queued → computing → ready, or rejected (bad file), or failed
 * (retry possible); a ready or failed recording replaced by a newer one of the same kind
 * becomes superseded (kept, shown and downloadable, never computed again). The table of
 * allowed moves lives in the backend's `recordings/recording-lifecycle.ts`.
 */
export const RECORDING_STATES = [
  'received',
  'validating',
  'queued',
  'computing',
  'ready',
  'rejected',
  'failed',
  'superseded',
] as const;
export type RecordingState = (typeof RECORDING_STATES)[number];

/** States in which a recording will not change again by itself. */
export const SETTLED_RECORDING_STATES: readonly RecordingState[] = [
  'ready',
  'rejected',
  'failed',
  'superseded',
];

/**
 * Why a region-of-interest channel did not contribute to a result: not in the file, flat,
 * saturated (runs at the converter's rail), another sampling rate than the rest of the region,
 * or left out by the visit's override (an analyst's choice, or an imported file's bad-channel list).
 */
export type RoiOmissionReason = 'missing' | 'flat' | 'saturated' | 'sample-rate' | 'excluded';

export interface RoiChannelOmission {
  /** The 10-10 name asked for (or the file's label when present). */
  label: string;
  reason: RoiOmissionReason;
}

/**
 * Which region-of-interest channels a run actually used. `complete`: every wanted channel;
 * `partial`: some left out (see `leftOut`); `none`: no channel remains, so there is no
 * region-of-interest result at all.
 */
export interface RoiUsageView {
  wanted: string[];
  used: string[];
  leftOut: RoiChannelOmission[];
  status: 'complete' | 'partial' | 'none';
}

/** Upload form fields beside `file` (and optional `onsets`). */
export interface UploadRecordingFields {
  kind: RecordingKind;
  /**
   * 'true' when the technician confirms the kind although the file looks like the other kind
   * (a resting file with stimulus annotations, a task file without onsets); kept as a warning.
   */
  confirmKind?: 'true';
  /** Id of the visit's current recording of the same kind that this upload replaces. */
  replaces?: string;
  /** Why the earlier recording is replaced (required with `replaces`). */
  replacementReason?: string;
}

/** Details of 422 RECORDING_KIND_UNCONFIRMED: what the file holds against the kind chosen. */
export interface KindMismatchDetails {
  kind: RecordingKind;
  /** Stimulus annotations found (resting upload) or onsets found (task upload). */
  onsetCount: number;
  found: string;
  expected: string;
}

/** Details of 409 RECORDING_KIND_TAKEN: the visit already has a current recording of this kind. */
export interface KindTakenDetails {
  kind: RecordingKind;
  recordingId: string;
}

/** What started a run. `rest-changed`: automatic, the visit's resting IAF appeared or changed. */
export type RunTrigger = 'upload' | 'rerun' | 'retry' | 'rest-changed' | 'override' | 'replacement';

export const JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type JobState = (typeof JOB_STATES)[number];

export const ANALYSIS_METHODS = ['filter', 'morlet'] as const;
export type AnalysisMethod = (typeof ANALYSIS_METHODS)[number];

/** Where a run's band came from: the study setting, the visit's resting IAF ± 2 Hz, or 8–13 Hz. */
export type BandSource = 'settings' | 'iaf' | 'default';

export const FLAG_STATES = ['raised', 'cleared'] as const;
export type FlagState = (typeof FLAG_STATES)[number];

export const REPORT_STATES = ['draft', 'signed', 'sent'] as const;
export type ReportState = (typeof REPORT_STATES)[number];

/** Why a file was refused: the reader's message and, when it names one, the field. */
export interface RecordingRejection {
  message: string;
  field: string | null;
  found: string | null;
  expected: string | null;
}

/** What validation learnt about an accepted file (no patient data: that field is blanked). */
export interface RecordingFactsView {
  format: 'EDF' | 'EDF+C' | 'EDF+D' | 'BDF' | 'BDF+C' | 'BDF+D';
  durationS: number;
  recordCount: number;
  recordDurationS: number;
  /** Ordinary (non-annotation) signals. */
  channelLabels: string[];
  sampleRatesHz: number[];
  /** Canonical 10-10 names of the region-of-interest channels present (default ROI). */
  roiChannels: string[];
  annotationCount: number;
  /**
   * Stimulus onsets found (CSV rows, else EDF+ annotations with text that are not artefact
   * marks); the upload compares it with the kind chosen.
   */
  stimulusOnsetCount: number;
  csvOnsetCount: number | null;
  warnings: string[];
}

export interface JobView {
  id: string;
  recordingId: string;
  state: JobState;
  attempts: number;
  maxAttempts: number;
  progressPercent: number;
  /** What asked for the computation (the run it makes names its settings version). */
  trigger: RunTrigger;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

export interface RecordingView {
  id: string;
  studyId: string;
  siteId: string;
  /** Null while the visit is blinded for the caller (blinded review). */
  participantId: string | null;
  visitId: string;
  kind: RecordingKind;
  state: RecordingState;
  checksumSha256: string;
  sizeBytes: number;
  /**
   * The uploaded file's name as the technician's computer gave it; null when none was sent
   * or the recording predates kept names. Only staff in the recording's scope see it.
   */
  fileName: string | null;
  /**
   * The power line frequency the file's source declared (EEG-BIDS `PowerLineFrequency`): Review
   * then applies that line-noise check alone. Null when not declared (both checks apply).
   */
  lineFrequencyHz: 50 | 60 | null;
  /** Progress of the current or last job, 0–100; null before any job. */
  progressPercent: number | null;
  facts: RecordingFactsView | null;
  rejection: RecordingRejection | null;
  failureMessage: string | null;
  latestJob: JobView | null;
  latestRunId: string | null;
  /** The kind was confirmed by the technician against what the file holds. */
  kindConfirmed: boolean;
  /**
   * Standing warnings a technician should see while the participant may still be in the
   * room: a confirmed kind, region-of-interest channels left out by the latest run, reader
   * warnings. Empty when there is nothing to say.
   */
  warnings: string[];
  /** The latest run's region-of-interest usage; null before any run. */
  roiUsage: RoiUsageView | null;
  /** The earlier recording this one replaced, and why. */
  replacesId: string | null;
  replacementReason: string | null;
  /** The newer recording that replaced this one (state `superseded`). */
  supersededById: string | null;
  uploadedById: string;
  createdAt: string;
  updatedAt: string;
}

/** `GET /api/recordings/:id/events` (Server-Sent Events, event name `recording`). */
export interface RecordingEvent {
  recordingId: string;
  state: RecordingState;
  progressPercent: number | null;
  error: string | null;
}

export interface AnalysisSettingsValues {
  /** Null: IAF ± 2 Hz of the visit's resting recording when there is one, else 8–13 Hz. */
  bandHz: [number, number] | null;
  method: AnalysisMethod;
  /** Cycles of the complex Morlet wavelet (method `morlet`). */
  morletCycles: number;
  epochWindowS: [number, number];
  baselineWindowS: [number, number];
  postWindowS: [number, number];
  /** Epochs whose mean-removed amplitude exceeds ± this are dropped. */
  rejectionThresholdUv: number;
  /** A slowing flag is suggested when ROI Δf ≤ this (Hz, negative) and the CI excludes 0. */
  flagThresholdHz: number;
  /** 10-10 channel names of the region of interest. */
  roi: string[];
  /** Which onsets to use (annotation text / CSV label); null = every onset. */
  onsetLabel: string | null;
  /**
   * Instantaneous-frequency samples whose analytic amplitude is under this percentile of the
   * channel's envelope are left out before the median and the epoch means; null = off.
   */
  amplitudeGatePercentile: number | null;
  /** Review warns when the cycle-by-cycle and the phase-based Δf differ by more, Hz. */
  cycleDisagreementHz: number;
  /** The two conditions (onset labels) whose Δf difference is reported; null = the first two. */
  compareConditions: [string, string] | null;
}

/**
 * Every settings field, in the order the settings page, a version's summary and the list of a
 * new version's changes show them. Compiles only while it names every field of the settings.
 */
export const ANALYSIS_SETTINGS_FIELDS = everyKeyOf<AnalysisSettingsValues>()([
  'bandHz',
  'method',
  'morletCycles',
  'epochWindowS',
  'baselineWindowS',
  'postWindowS',
  'rejectionThresholdUv',
  'flagThresholdHz',
  'roi',
  'onsetLabel',
  'amplitudeGatePercentile',
  'cycleDisagreementHz',
  'compareConditions',
]);

/** A list of keys of T that the compiler refuses while one key is missing (it names it). */
function everyKeyOf<T>() {
  return <const K extends readonly (keyof T)[]>(
    keys: K &
      ([Exclude<keyof T, K[number]>] extends [never]
        ? unknown
        : { missing: Exclude<keyof T, K[number]> }),
  ): K => keys;
}

/** The analysis-depth settings a run was computed with (read from its stored settings). */
export type RunDepthSettings = Pick<
  AnalysisSettingsValues,
  'amplitudeGatePercentile' | 'cycleDisagreementHz' | 'compareConditions'
>;

/** `POST /api/studies/:studyId/analysis-settings`: a new version. */
export interface AnalysisSettingsChange extends AnalysisSettingsValues {
  reason: string;
}

export interface AnalysisSettingsView extends AnalysisSettingsValues {
  id: string;
  studyId: string;
  version: number;
  /** Fields that differ from the previous version (empty for version 1). */
  changes: SettingsFieldChange[];
  reason: string;
  createdById: string | null;
  createdAt: string;
}

export interface AnalysisRunView {
  id: string;
  recordingId: string;
  visitId: string;
  /** Null while the visit is blinded for the caller (blinded review). */
  participantId: string | null;
  kind: RecordingKind;
  settingsId: string;
  settingsVersion: number;
  codeVersion: string;
  inputChecksumSha256: string;
  bandHz: [number, number];
  bandSource: BandSource;
  /** Task: ROI Δf = post − baseline in Hz (negative = slowing). */
  roiDeltaFHz: number | null;
  roiCiHz: [number, number] | null;
  roiPValue: number | null;
  trialsKept: number | null;
  trialsTotal: number | null;
  /** Rest: ROI peak alpha frequency; null = no clear peak. */
  pafHz: number | null;
  cogHz: number | null;
  suggestsSlowing: boolean | null;
  /** What started the run (automatic re-runs say why). */
  trigger: RunTrigger;
  /** Which region-of-interest channels the numbers come from. */
  roiUsage: RoiUsageView;
  /** The visit override in force when the run was made, if any (its revision). */
  overrideRevision: number | null;
  /**
   * The run's own amplitude gate, cross-check threshold and compared pair: what its numbers
   * and its `cycles.disagrees` were computed with, whatever the study's settings say now.
   */
  depthSettings: RunDepthSettings;
  /**
   * What the study's current settings (with the visit's override) would compute differently
   * from this run, in words ("post window 0.2–0.8 s → 0.3–0.9 s"); empty when nothing would
   * change. Only then is a "computed with older settings" notice shown.
   */
  staleSettings: string[];
  createdAt: string;
}

/**
 * A visit's own analysis choices over the study's settings (audited): region of interest,
 * band and onset label. Null fields fall back to the study's settings.
 */
export interface VisitAnalysisOverrideValues {
  roi: string[] | null;
  bandHz: [number, number] | null;
  onsetLabel: string | null;
}

/** `PUT /api/visits/:visitId/analysis-override` (a reason is required; identical values → 409). */
export interface VisitAnalysisOverrideChange extends VisitAnalysisOverrideValues {
  reason: string;
}

export interface VisitAnalysisOverrideView extends VisitAnalysisOverrideValues {
  visitId: string;
  /** 1 for the first override of the visit, +1 per change; 0 = none (study settings only). */
  revision: number;
  reason: string | null;
  updatedById: string | null;
  updatedAt: string | null;
}

/** One field of a settings version that differs from the previous version. */
export interface SettingsFieldChange {
  field: keyof AnalysisSettingsValues;
  before: unknown;
  after: unknown;
}

/** Mean instantaneous frequency around onset, for one channel or the ROI. */
export interface OnsetCurveView {
  name: string;
  meanHz: Array<number | null>;
  ciLowHz: Array<number | null>;
  ciHighHz: Array<number | null>;
}

export interface ChannelStatsView {
  label: string;
  canonical: string | null;
  inRoi: boolean;
  baselineHz: number | null;
  postHz: number | null;
  deltaFHz: number | null;
  ciHz: [number, number] | null;
  pValue: number | null;
  trials: number | null;
  /** Resting recordings: this channel's own peak and centre of gravity (scalp maps), Hz. */
  pafHz: number | null;
  cogHz: number | null;
  /** Task recordings: samples the amplitude gate left out; null when not computed. */
  amplitudeGate: AmplitudeGateView | null;
}

export interface TaskResultsView {
  /** Seconds relative to onset, one per curve point. */
  timeS: number[];
  baselineWindowS: [number, number];
  postWindowS: [number, number];
  roi: OnsetCurveView;
  /**
   * Channels that have an onset curve of their own (file labels). The screen shows one curve
   * at a time, so each is fetched when picked: `GET …/results/curves?channel=` (OnsetCurveView).
   */
  curveChannels: string[];
  /**
   * Size of the region of interest's trial raster (kept trials × time points, at most 500);
   * the raster itself and the per-trial detail come from `GET …/results/raster`.
   */
  raster: { trials: number; points: number };
  epochs: { total: number; kept: number; dropped: Record<string, number> };
  /** Δf per condition (onset label), in order of first appearance; empty without labels. */
  conditions: ConditionStatsView[];
  /** Region-of-interest onset curve of each condition, named by its label. */
  conditionCurves: OnsetCurveView[];
  /** The difference of two conditions' Δf; null with fewer than two conditions. */
  conditionDifference: ConditionDifferenceView | null;
  /** The cycle-by-cycle cross-check of the region of interest's Δf. */
  cycles: CycleEstimateView | null;
}

/**
 * Why epochs were dropped (the keys of `TaskResultsView.epochs.dropped`), in the words Review
 * and the visit report both print; an unknown key is shown as it came.
 */
export const EPOCH_DROP_WORDS: Readonly<Record<string, string>> = {
  edge: 'too close to the recording edge',
  amplitude: 'amplitude beyond the rejection threshold',
  artefact: 'overlapping an artefact annotation',
  amplitudeGate: 'no sample left in a window after the amplitude gate',
};

/**
 * `GET /api/recordings/:id/results/raster?runId=`: the region of interest's trial raster and
 * each trial's Δf, for the Review raster chart (fetched only when it is shown).
 */
export interface TrialRasterView {
  /** Seconds relative to onset, one per column. */
  timeS: number[];
  /** Onset of each row (kept trial), s from the recording start. */
  trialOnsetsS: number[];
  /** Per-trial Δf of the region of interest, Hz; null = undefined. */
  trialDeltaFHz: Array<number | null>;
  trials: number;
  points: number;
  /**
   * Instantaneous frequency, Hz, trials × points row after row (`valuesHz[trial * points +
   * point]`); null = dropped or undefined.
   */
  valuesHz: Array<number | null>;
}

/**
 * Decimal places of the series in the results answers over HTTP (`GET …/results`,
 * `…/results/raster`, `…/results/curves`): the one place where this rule is written. The
 * stored run keeps every value at full precision (the visit report and the numbers' hash read
 * that); headline numbers, the per-channel table and the quality checks are never rounded.
 * Each precision is finer than anything a screen shows or a reader could act on.
 */
export const RESULT_SERIES_DECIMALS = {
  /** Curve and raster time axes, s: 0.1 ms, against samples ≥ 1 ms apart (≤ 1 kHz). */
  timeS: 4,
  /** Onset curves' mean and 95 % CI, Hz: 1e-4 Hz; Review shows 0.01 Hz. */
  curveHz: 4,
  /** Raster cells, Hz: 0.01 Hz on a colour scale spanning the ≥ 1 Hz band, legend to 0.1 Hz. */
  rasterHz: 2,
  /** Per-trial Δf, Hz: 1e-4 Hz, as the curves. */
  trialDeltaFHz: 4,
  /** Trial onsets, s from the recording start: 0.1 ms. */
  trialOnsetsS: 4,
  /** Rest spectrum frequencies, Hz: 1e-4 Hz (Welch bins are 0.25 Hz apart by default). */
  spectrumFrequencyHz: 4,
} as const;

/**
 * Significant digits of the rest spectrum's power in the HTTP answer: 4 (relative error
 * ≤ 5e-4, far below a pixel on the spectrum's axis, which spans decades).
 */
export const SPECTRUM_POWER_SIGNIFICANT_DIGITS = 4;

export interface RestResultsView {
  frequencyHz: number[];
  /** ROI power spectral density, µV²/Hz. */
  powerUv2PerHz: number[];
  pafHz: number | null;
  cogHz: number | null;
  /** Peak height over the 1/f background, dB; null without a clear peak. */
  prominenceDb: number | null;
  /** Why no PAF was reported (e.g. `below-prominence`), else null. */
  noPeakReason: string | null;
  /** Where the peak was searched, Hz. */
  alphaWindowHz: [number, number];
}

export interface ChannelQualityView {
  label: string;
  standardDeviationUv: number | null;
  flat: boolean;
  saturatedShare: number | null;
  saturated: boolean;
  lineNoiseRatio50Hz: number | null;
  lineNoiseRatio60Hz: number | null;
  /** Share of raw instantaneous-frequency values outside the band (phase slips). */
  phaseSlipShare: number | null;
}

/** Quality checks shown with every result (docs/method.md §6). */
export interface QualityView {
  durationS: number;
  sampleRatesHz: number[];
  /** Region-of-interest channels present in the file (usable or not), file labels. */
  roiChannelsFound: string[];
  /** Region-of-interest names not in the file. */
  roiChannelsMissing: string[];
  flatChannels: string[];
  saturatedChannels: string[];
  /** Median over channels of the line-noise ratios. */
  lineNoiseRatio50Hz: number | null;
  lineNoiseRatio60Hz: number | null;
  /** Dropped epochs over all epochs of the region of interest. */
  epochsDroppedShare: number | null;
  /** Mean over the region of interest of the phase-slip share. */
  phaseSlipShare: number | null;
  alphaPeakProminenceDb: number | null;
  channels: ChannelQualityView[];
  warnings: string[];
}

export interface RecordingResultsView {
  run: AnalysisRunView;
  /** The recording the numbers come from (a visit may hold superseded recordings too). */
  source: {
    recordingId: string;
    kind: RecordingKind;
    uploadedAt: string;
    checksumSha256: string;
    replacesId: string | null;
    replacementReason: string | null;
  };
  channels: ChannelStatsView[];
  task: TaskResultsView | null;
  rest: RestResultsView | null;
  quality: QualityView;
}

export interface FlagView {
  id: string;
  visitId: string;
  state: FlagState;
  raisedById: string;
  raiseReason: string;
  raisedAt: string;
  clearedById: string | null;
  clearReason: string | null;
  clearedAt: string | null;
}

/** What the computation suggests for a visit; shown beside the flag, never acting alone. */
export interface FlagSuggestion {
  suggestsSlowing: boolean;
  runId: string;
  roiDeltaFHz: number | null;
  roiCiHz: [number, number] | null;
  flagThresholdHz: number;
  /** The region-of-interest channels behind the suggestion; `status: 'none'` = no suggestion possible. */
  roiUsage: RoiUsageView;
}

export interface VisitFlagView {
  visitId: string;
  current: FlagView | null;
  suggestion: FlagSuggestion | null;
  history: FlagView[];
}

export interface FlagChange {
  reason: string;
}

export interface ReportView {
  id: string;
  visitId: string;
  /** Null while the visit is blinded for the caller (blinded review). */
  participantId: string | null;
  siteId: string;
  state: ReportState;
  createdAt: string;
  updatedAt: string;
}

export interface TrajectoryVisitView {
  visitId: string;
  label: string;
  date: string;
  pafHz: number | null;
  cogHz: number | null;
  deltaFHz: number | null;
  /** Change from the first visit that has the value. */
  pafChangeHz: number | null;
  cogChangeHz: number | null;
  deltaFChangeHz: number | null;
  flagged: boolean;
  /**
   * Why a number of this visit may be doubtful, in words: region-of-interest channels left
   * out, no region-of-interest channel at all, a task band that could not follow a resting
   * IAF. Empty when nothing is in doubt.
   */
  doubts: string[];
}

/**
 * Why a trend has no slope: fewer visits with a value than the study's `trendMinVisits`, or
 * those visits span fewer days than its `trendMinSpanDays`.
 */
export type TrendReason = 'too-few-visits' | 'span-too-short';

/** One measure's trend over a participant's visits and whether the study's rule allows it. */
export interface TrendView {
  /** Theil–Sen slope over visit dates, Hz per year; null when the rule does not allow one. */
  slopeHzPerYear: number | null;
  /** Null when a slope is given. */
  reason: TrendReason | null;
  /** Visits with a value of this measure. */
  visits: number;
  /** Days from the first to the last of those visits (0 with fewer than two). */
  spanDays: number;
}

export interface TrajectoryView {
  participantId: string;
  visits: TrajectoryVisitView[];
  /** The study's rule: a slope needs this many visits with a value spanning this many days. */
  trendRule: { minVisits: number; minSpanDays: number };
  trends: { paf: TrendView; cog: TrendView; deltaF: TrendView };
  /** The trends' slopes (null where the rule gives none); kept for older readers. */
  slopesHzPerYear: { paf: number | null; cog: number | null; deltaF: number | null };
}
