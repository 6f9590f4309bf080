/**
 * The signal core's public API, published as `@gyre/backend/signal` (built to
 * `dist/signal/index.js` with its declarations). Other workspaces (the demo seeder, the
 * browser tests) import from here only, never by a path into `backend/src` or `backend/dist`.
 * The core itself imports nothing from the rest of the backend.
 */

// EDF/EDF+ reading and writing (Kemp et al. 1992; Kemp & Olivan 2003).
export * from './edf';
export { readEdfFile } from './pipeline/read-edf-file';
export type { EdfFileRead, ReadEdfFileOptions } from './pipeline/read-edf-file';

// Onsets and channel names.
export {
  artefactRegExp,
  isStimulusAnnotation,
  OnsetCsvError,
  parseOnsetCsv,
  stimulusAnnotations,
} from './onsets';
export type { ParseOnsetCsvOptions, StimulusOnset } from './onsets';
export {
  canonicalElectrodeName,
  DEFAULT_POSTERIOR_ROI,
  normaliseChannelLabel,
  roiChannels,
} from './channels';
export type { RoiChannel } from './channels';

// The one settings vocabulary and the computation knobs.
export {
  BOOTSTRAP_RESAMPLES,
  BOOTSTRAP_SEED,
  copyAnalysisSettings,
  DEFAULT_ALPHA_BAND_HZ,
  DEFAULT_ANALYSIS_SETTINGS,
  IAF_HALF_WIDTH_HZ,
  resolveAnalysisBand,
} from './pipeline/analysis-settings';
export type {
  AnalysisBandSource,
  AnalysisSettings,
  NarrowBandMethodName,
} from './pipeline/analysis-settings';
export {
  DEFAULT_ANALYSIS_COMPUTATION,
  DEFAULT_ARTEFACT_PATTERN,
  resolveComputation,
} from './pipeline/analysis-computation';
export type {
  AnalysisComputation,
  AnalysisComputationOptions,
} from './pipeline/analysis-computation';

// The analysis and its results: the whole run (`analyzeRecording`), or its three steps for a
// run whose channels are analysed in parts (plan, channels, merge; the same numbers).
export { AnalysisInputError } from './pipeline/analysis-input-error';
export { analyzeRecording } from './pipeline/analyze-recording';
export { analysedSignalIndices, outlineOf, planAnalysis } from './pipeline/analysis-plan';
export type { AnalysisPlan, PlannedChannel, RecordingOutline } from './pipeline/analysis-plan';
export { analyzeChannels, channelPartBuffers } from './pipeline/analyze-channels';
export type { ChannelPart, KeptEpochs, RecordingPart } from './pipeline/analyze-channels';
export { mergeChannelParts } from './pipeline/merge-channel-parts';
export type {
  AnalysisAnnotation,
  AnalysisContext,
  AnalysisRecording,
  AnalysisResult,
  AnalysisSignal,
  ChannelResult,
  ComputationUsed,
  DropCounts,
  OnsetCurveResult,
  OnsetInput,
  OnsetResult,
  RecordingKindChoice,
  RestResult,
  RoiResult,
  RoiUsage,
} from './pipeline/analysis.types';
export {
  analysedChannelSamples,
  analyzeEdfRecording,
  edfRecordingPart,
  isAnalysedSignal,
  planEdfAnalysis,
  readRecordingForAnalysis,
} from './pipeline/analyze-edf-recording';
export type { AnalysisRunRequest, ChannelRange } from './pipeline/analyze-edf-recording';
export { toAnalyzeOutcome } from './pipeline/run-summary';
export type { AnalyzeOutcome, ResultSeries, RunSummary } from './pipeline/run-summary';

// Quality checks (flat and saturated channels, line noise).
export {
  channelQuality,
  DEFAULT_QUALITY_THRESHOLDS,
  EDF_DIGITAL_RANGE,
  lineNoiseRatio,
  quantisationStep,
  railRunShare,
  SATURATION_MAX_SHARE,
  SATURATION_MIN_RUN_SAMPLES,
} from './quality/quality-checks';
export type {
  ChannelQuality,
  ChannelQualityThresholds,
  ConverterRange,
  QualityResult,
} from './quality/quality-checks';

// The one seeded random-number module, and generated recordings with known answers (tests,
// benchmarks, browser tests and the demo data; nothing here is measured EEG).
export { fnv1a32, mixSeed, SeededRandom, seededNormal, seededUniform } from './random/random';
export {
  syntheticEdf,
  syntheticRestRecording,
  syntheticTaskFrequencyHz,
  syntheticTaskRecording,
} from './synthetic/synthetic-eeg';
export type {
  SyntheticEdfOptions,
  SyntheticRestOptions,
  SyntheticTaskOptions,
} from './synthetic/synthetic-eeg';
export {
  DEFAULT_DIP_SHAPE,
  dipWeight,
  frequencyTrack,
  phaseFromFrequency,
} from './synthetic/alpha-rhythm';
export type { DipShape, FrequencyTrackOptions } from './synthetic/alpha-rhythm';
export { addPinkNoise, fillSlowNoise } from './synthetic/background-noise';
export type { PinkNoiseOptions, SlowNoiseOptions } from './synthetic/background-noise';
export { addBlinks, BLINK_DURATION_S, blinkShape } from './synthetic/eye-blinks';
export type { Blink } from './synthetic/eye-blinks';
