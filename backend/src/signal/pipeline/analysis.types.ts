import type {
  ConditionDifferenceView,
  ConditionStatsView,
  CycleEstimateView,
  RoiUsageView,
} from '@gyre/shared';
import type { AmplitudeGateCount } from '../frequency/amplitude-gate';
import type { OnsetStatistics } from '../trials/onset-statistics';
import type { QualityResult } from '../quality/quality-checks';
import { NoPeakReason } from '../spectrum/alpha-peak';
import type { AnalysisComputation } from './analysis-computation';
import type { AnalysisBandSource, AnalysisSettings } from './analysis-settings';

/** One ordinary signal; an `EdfSignal` of the EDF reader fits as it is. */
export interface AnalysisSignal {
  label: string;
  sampleRateHz: number;
  /** Physical values in `physicalDimension` (µV if absent). */
  samples: Float32Array;
  physicalDimension?: string;
  /** Physical values of the converter's rails; with them the saturation check runs. */
  physicalMin?: number;
  physicalMax?: number;
  /** Digital rails (EDF header); default the EDF 16-bit range. */
  digitalMin?: number;
  digitalMax?: number;
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

/** What one run knows besides the recording and the settings. */
export interface AnalysisContext {
  /** 'auto': task when stimulus onsets are found, rest otherwise. */
  kind: RecordingKindChoice;
  /** The participant's resting IAF for this visit (PAF, else CoG), Hz; null when unknown. */
  iafHz: number | null;
  /** Onsets from a CSV; when given, annotations are not used as onsets. */
  onsets?: readonly OnsetInput[];
  /**
   * Two conditions (onset labels) a caller asks to compare, over the settings'
   * `compareConditions` (the command line's --compare): the difference says 'request'.
   */
  compareConditions?: readonly [string, string] | null;
  /** Called with the share of work done, 0…1. */
  onProgress?: (fraction: number) => void;
}

/**
 * Which region-of-interest channels a result comes from and why others were left out
 * (the API's `RoiUsageView`). The signal core never says 'excluded': that is the server's
 * word for a channel a visit override removed from the settings' `roi`.
 */
export type RoiUsage = RoiUsageView;

export interface DropCounts {
  edge: number;
  amplitude: number;
  artefact: number;
  /** Only when the amplitude gate is on: no frequency value left in a window. */
  amplitudeGate?: number;
}

export interface OnsetCurveResult {
  timesS: Float64Array;
  meanHz: Float64Array;
  lowerHz: Float64Array;
  upperHz: Float64Array;
}

/** The statistics of the kept trials, with what was kept and dropped and the mean curve. */
export interface OnsetResult extends OnsetStatistics {
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
  /** True only when the channel contributed to the region-of-interest result. */
  inRoi: boolean;
  /** What the amplitude gate left out of this channel; null when it is off. */
  amplitudeGate: AmplitudeGateCount | null;
}

export interface RoiResult extends OnsetResult {
  /** Labels of the channels averaged. */
  channels: string[];
  /** Onset of each kept trial (one per raster row), s from the recording start. */
  trialOnsetsS: number[];
  /** Trials × curve points, Hz, row-major (kept trials only). */
  raster: Float32Array;
  rasterTrials: number;
  rasterPoints: number;
  /** Per condition (onset label, in order of first appearance): the same statistics. */
  conditions: ConditionResult[];
  /** Δf of two conditions' difference; null with fewer than two or a named one without trials. */
  conditionDifference: ConditionDifferenceView | null;
}

/** The region of interest's statistics over one condition's trials (docs/method.md, "Conditions"). */
export interface ConditionResult extends ConditionStatsView {
  /** Per kept trial of the condition: post − baseline, Hz. */
  trialDeltaFHz: Float64Array;
  curve: OnsetCurveResult;
}

export interface RestResult {
  pafHz: number | null;
  cogHz: number | null;
  prominenceDb: number | null;
  noPeakReason: NoPeakReason | null;
  /** Mean spectrum over the region of interest, 0 … 60 Hz at most. */
  spectrum: { frequencyHz: Float64Array; powerPerHz: Float64Array };
  channels: string[];
  /** Every channel's own PAF and CoG from its own spectrum (null without one), in file order. */
  channelPeaks: { label: string; pafHz: number | null; cogHz: number | null }[];
}

/** The computation knobs of a run with what followed from them. */
export interface ComputationUsed extends AnalysisComputation {
  /** Centre of the Morlet wavelet, Hz (the IAF when known, else the band centre); null for 'filter'. */
  morletCentreHz: number | null;
  bootstrapResamples: number;
  bootstrapSeed: number;
  /** Median window lengths per sampling rate (key: rate in Hz), samples. */
  medianWindowsSamples: Record<string, number[]>;
  /** Onsets chosen (after the onset label), before any epoch was dropped. */
  onsetCount: number;
}

export interface AnalysisResult {
  kind: 'task' | 'rest';
  /** The settings the run was given (a copy). */
  settings: AnalysisSettings;
  /** The resting IAF the run was given, Hz. */
  iafHz: number | null;
  /** The band used and where it came from (`resolveAnalysisBand`). */
  bandHz: [number, number];
  bandSource: AnalysisBandSource;
  computation: ComputationUsed;
  roiUsage: RoiUsage;
  channels: ChannelResult[];
  roi: RoiResult | null;
  rest: RestResult | null;
  /** Task runs: the region's cycle-by-cycle Δf beside the phase-based one; null without a region. */
  cycles: CycleEstimateView | null;
  qc: QualityResult;
  warnings: string[];
}
