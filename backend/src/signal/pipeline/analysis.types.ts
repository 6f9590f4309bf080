import { NarrowBandMethod } from '../frequency/frequency-sliding';
import { WilcoxonMethod } from '../onset/wilcoxon';
import { ChannelQuality } from '../quality/quality-checks';
import { NoPeakReason } from '../spectrum/alpha-peak';

/** One ordinary signal; an `EdfSignal` of the EDF reader fits as it is. */
export interface AnalysisSignal {
  label: string;
  sampleRateHz: number;
  /** Physical values in `physicalDimension` (µV if absent). */
  samples: Float32Array;
  physicalDimension?: string;
  physicalMin?: number;
  physicalMax?: number;
  samplesPerRecord?: number;
}

/** One annotation; an `EdfAnnotation` of the EDF reader fits as it is. */
export interface AnalysisAnnotation {
  onsetS: number;
  durationS: number | null;
  text: string;
}

/** What `analyzeRecording` reads; an `EdfRecording` of the EDF reader fits as it is. */
export interface AnalysisRecording {
  signals: readonly AnalysisSignal[];
  annotations?: readonly AnalysisAnnotation[];
  /** Seconds; default: the longest signal's sample count / rate. */
  durationS?: number;
  /** Start of each data record, s (EDF+D may have gaps between records). */
  recordStartsS?: Float64Array;
  header?: { recordDurationS: number; format?: string };
}

/** A stimulus onset given apart from the file, e.g. parsed from an onset CSV. */
export interface OnsetInput {
  onsetS: number;
  label: string;
}

export type RecordingKindChoice = 'task' | 'rest' | 'auto';

export interface AnalysisOptions {
  /** 'auto' (default): task when onsets are found, rest otherwise. */
  kind?: RecordingKindChoice;
  /** Analysis band, Hz (default IAF ± 2 Hz with `iafHz`, else 8–13 Hz). */
  bandHz?: readonly [number, number];
  /** The participant's resting IAF for this visit, Hz, when known. */
  iafHz?: number | null;
  method?: NarrowBandMethod;
  transitionFraction?: number;
  morletCycles?: number;
  /** Onsets from a CSV; when given, annotations are not used as onsets. */
  onsets?: readonly OnsetInput[];
  /** Only onsets with this label (annotation text or CSV label, case-insensitive). */
  onsetLabel?: string | null;
  /** Regular expression source for artefact annotations (default "artefact|artifact", case-insensitive). */
  artefactPattern?: string;
  epochS?: readonly [number, number];
  baselineS?: readonly [number, number];
  postS?: readonly [number, number];
  edgeGuardS?: number;
  /** ± limit on the raw epoch after mean removal, µV (default 100, common practice). */
  amplitudeLimitUv?: number;
  bootstrapResamples?: number;
  bootstrapSeed?: number;
  slowingThresholdHz?: number;
  /** Region of interest as 10-10 names (default: the posterior set of METHOD.md §1). */
  roiLabels?: readonly string[];
  welchSegmentS?: number;
  welchOverlapFraction?: number;
  alphaSearchHz?: readonly [number, number];
  cogBandHz?: readonly [number, number];
  minPeakProminenceDb?: number;
  /** Curve and raster points at most (default 500). */
  maxCurvePoints?: number;
  /** Called with the share of work done, 0…1. */
  onProgress?: (fraction: number) => void;
}

export interface DropCounts {
  edge: number;
  amplitude: number;
  artefact: number;
}

export interface OnsetCurveResult {
  timesS: Float64Array;
  meanHz: Float64Array;
  lowerHz: Float64Array;
  upperHz: Float64Array;
}

export interface OnsetResult {
  baselineHz: number | null;
  postHz: number | null;
  deltaHz: number | null;
  ci95Hz: [number, number] | null;
  p: number | null;
  wilcoxonMethod: WilcoxonMethod | null;
  suggestedFlag: boolean;
  trialsKept: number;
  trialsDropped: number;
  dropReasons: DropCounts;
  /** Per kept trial: baseline, post and Δf, Hz. */
  trialBaselineHz: Float64Array;
  trialPostHz: Float64Array;
  curve: OnsetCurveResult;
}

export interface ChannelResult extends OnsetResult {
  label: string;
  /** Canonical 10-10 name, null when the label is not one. */
  electrode: string | null;
  inRoi: boolean;
}

export interface RoiResult extends OnsetResult {
  /** Labels of the channels averaged. */
  channels: string[];
  /** Trials × curve points, Hz, row-major (kept trials only). */
  raster: Float32Array;
  rasterTrials: number;
  rasterPoints: number;
}

export interface RestResult {
  pafHz: number | null;
  cogHz: number | null;
  prominenceDb: number | null;
  noPeakReason: NoPeakReason | null;
  /** Mean spectrum over the region of interest, 0 … 60 Hz at most. */
  spectrum: { frequencyHz: Float64Array; powerPerHz: Float64Array };
  channels: string[];
}

export interface QualityResult {
  durationS: number;
  sampleRatesHz: number[];
  roiChannelsFound: string[];
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
  channels: ChannelQuality[];
}

export interface ResolvedSettings {
  kind: 'task' | 'rest';
  bandHz: [number, number];
  method: NarrowBandMethod;
  transitionFraction: number;
  morletCycles: number;
  medianWindowsSamples: Record<string, number[]>;
  epochS: [number, number];
  baselineS: [number, number];
  postS: [number, number];
  edgeGuardS: number;
  amplitudeLimitUv: number;
  bootstrapResamples: number;
  bootstrapSeed: number;
  slowingThresholdHz: number;
  onsetLabel: string | null;
  onsetCount: number;
  welchSegmentS: number;
  welchOverlapFraction: number;
  alphaSearchHz: [number, number];
  cogBandHz: [number, number];
  minPeakProminenceDb: number;
}

export interface AnalysisResult {
  kind: 'task' | 'rest';
  settings: ResolvedSettings;
  channels: ChannelResult[];
  roi: RoiResult | null;
  rest: RestResult | null;
  qc: QualityResult;
  warnings: string[];
}
