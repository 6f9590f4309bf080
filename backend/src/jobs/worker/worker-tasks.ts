/**
 * Messages between the server and its worker threads. Plain data and typed arrays
 * only, so they cross the thread boundary by structured clone (arrays by transfer).
 */
import type { MessagePort } from 'node:worker_threads';
import type { AnalysisSettings } from '../../signal/pipeline/analysis-settings';

/** A run's results are the signal core's own types, so the worker and the command line agree. */
export type { AnalyzeOutcome, ResultSeries, RunSummary } from '../../signal/pipeline/run-summary';

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
  /**
   * Stimulus onsets the file or its CSV offers (CSV rows, else EDF+ annotations with text that
   * are not artefact marks); the upload compares it with the kind chosen.
   */
  stimulusOnsetCount: number;
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

export interface AnalyzeTask {
  filePath: string;
  /** The file must hash to this (SHA-256 hex) or the run fails: results name their input. */
  checksumSha256: string;
  kind: RecordingKindName;
  csvOnsets: Array<{ onsetS: number; label: string }> | null;
  /** The effective settings (study version with the visit's override), unchanged. */
  settings: AnalysisSettings;
  /** The visit's resting IAF (PAF, else CoG), Hz, when one exists; the band follows it. */
  iafHz: number | null;
  /** Receives progress numbers 0–100. */
  progressPort: MessagePort;
}
