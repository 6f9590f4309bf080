/**
 * Messages between the server and its worker threads. Plain data and typed arrays
 * only, so they cross the thread boundary by structured clone (arrays by transfer).
 */
import type { MessagePort } from 'node:worker_threads';
import type { ChannelStatsDto, QualityDto } from '@gyre/shared';

export type RecordingKindName = 'resting' | 'task';

/** Check an uploaded file completely (every record, annotations, onsets) before it is queued. */
export interface ValidateTask {
  filePath: string;
  kind: RecordingKindName;
  /** The onset CSV's text, when one came with the recording. */
  onsetsCsv: string | null;
}

/** What the header and the reader tell about a file that passed. */
export interface RecordingFacts {
  format: 'EDF' | 'EDF+C' | 'EDF+D';
  durationS: number;
  recordCount: number;
  recordDurationS: number;
  /** Ordinary (non-annotation) signals. */
  channelLabels: string[];
  sampleRatesHz: number[];
  /** Canonical 10-10 names of the region-of-interest channels present (default ROI). */
  roiChannels: string[];
  annotationCount: number;
  /** Stimulus onsets from the CSV, seconds after the recording start; null without a CSV. */
  csvOnsets: Array<{ onsetS: number; label: string }> | null;
  warnings: string[];
}

export type ValidateOutcome =
  | { ok: true; facts: RecordingFacts }
  | {
      ok: false;
      /** The reader's message, shown as is. */
      message: string;
      field: string | null;
      found: string | null;
      expected: string | null;
    };

/** Settings resolved for one run, in the signal core's terms. */
export interface ResolvedAnalysisOptions {
  bandHz: [number, number];
  method: 'filter' | 'morlet';
  morletCycles: number;
  epochWindowS: [number, number];
  baselineWindowS: [number, number];
  postWindowS: [number, number];
  rejectionThresholdUv: number;
  flagThresholdHz: number;
  roi: string[];
  /** Which onsets to use: EDF+ annotation text / CSV label; null = all. */
  onsetLabel: string | null;
  bootstrapResamples: number;
  bootstrapSeed: number;
}

export interface AnalyzeTask {
  filePath: string;
  /** The file must hash to this (SHA-256 hex) or the run fails: results name their input. */
  checksumSha256: string;
  kind: RecordingKindName;
  csvOnsets: Array<{ onsetS: number; label: string }> | null;
  options: ResolvedAnalysisOptions;
  /** Receives progress numbers 0–100. */
  progressPort: MessagePort;
}

/** Named numeric series of one run, moved (not copied) out of the worker. */
export type ResultSeries = Record<string, Float64Array>;

/** The small, JSON-friendly part of a run's results. */
export interface RunSummary {
  channels: ChannelStatsDto[];
  /** Task recordings: the region of interest's statistics over trials. */
  roi: {
    baselineHz: number | null;
    postHz: number | null;
    deltaFHz: number | null;
    ciHz: [number, number] | null;
    pValue: number | null;
    trialsKept: number;
    trialsTotal: number;
  } | null;
  task: {
    baselineWindowS: [number, number];
    postWindowS: [number, number];
    epochs: { total: number; kept: number; dropped: Record<string, number> };
    trialOnsetsS: number[];
    /** Names of the per-channel curves in `series` (`channel:<label>:mean|ciLow|ciHigh`). */
    curveChannels: string[];
    rasterTrials: number;
    rasterPoints: number;
  } | null;
  rest: {
    pafHz: number | null;
    cogHz: number | null;
    prominenceDb: number | null;
    noPeakReason: string | null;
    alphaWindowHz: [number, number];
  } | null;
  quality: QualityDto;
  suggestsSlowing: boolean | null;
}

/**
 * Series names: `timeS`, `roi:mean|ciLow|ciHigh`, `channel:<label>:mean|ciLow|ciHigh`,
 * `raster:timeS`, `raster` (trials × points, row-major), `trialDeltaFHz`,
 * `rest:frequencyHz`, `rest:powerUv2PerHz`. NaN stands for "no value".
 */
export interface AnalyzeOutcome {
  summary: RunSummary;
  series: ResultSeries;
}
