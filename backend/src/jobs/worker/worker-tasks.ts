/**
 * Messages between the server and its worker threads. Plain data and typed arrays
 * only, so they cross the thread boundary by structured clone (arrays by transfer).
 */
import type { MessagePort } from 'node:worker_threads';
import type { RecordingFactsView } from '@gyre/shared';
import type { AnalysisPlan } from '../../signal/pipeline/analysis-plan';
import type { AnalysisSettings } from '../../signal/pipeline/analysis-settings';
import type { ChannelPart } from '../../signal/pipeline/analyze-channels';
import type { ChannelRange } from '../../signal/pipeline/analyze-edf-recording';

/** A run's results are the signal core's own types, so the worker and the command line agree. */
export type { AnalyzeOutcome, RunSummary } from '../../signal/pipeline/run-summary';

export type RecordingKindName = 'resting' | 'task';

/** Check an uploaded file completely (every record, annotations, onsets) before it is queued. */
export interface ValidateTask {
  filePath: string;
  kind: RecordingKindName;
  /** The onset CSV's text, when one came with the recording. */
  onsetsCsv: string | null;
}

/**
 * What the header and the reader tell about a file that passed: the view the API shows, with the
 * CSV's onsets themselves where the view has only their count.
 */
export interface RecordingFacts extends Omit<RecordingFactsView, 'csvOnsetCount'> {
  /** Stimulus onsets from the CSV, seconds after the recording start; null without a CSV. */
  csvOnsets: Array<{ onsetS: number; label: string }> | null;
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

/** One computation: the stored file, what the run names and how it is computed. */
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
}

/**
 * Some channels of a computation, on one thread. The lead part (the one with the first
 * channels) also hashes the file and keeps the reader's warnings, so the file is hashed once.
 */
export interface AnalyzePartTask extends AnalyzeTask {
  lead: boolean;
  /**
   * The part's channels, decoded one batch at a time (one pass over the file each), in
   * order; null: every analysed channel at once (the file's header could not be read).
   */
  batches: ChannelRange[] | null;
  /** Receives the share of the part done, 0…1. */
  progressPort?: MessagePort;
}

/** What a part returns: plain data and typed arrays (moved, not copied). */
export interface PartOutcome {
  /** The plan the part computed from the file (every part must find the same). */
  plan: AnalysisPlan;
  channels: ChannelPart[];
  /** The lead part only: the EDF reader's warnings about the whole file. */
  readerWarnings: string[] | null;
  /** When the part ran, ms since the epoch, and on which thread. */
  timing: { threadId: number; startedMs: number; endedMs: number };
}

/** The merge of a computation's parts into its results. */
export interface MergeTask {
  plan: AnalysisPlan;
  parts: ChannelPart[][];
  readerWarnings: string[];
}
