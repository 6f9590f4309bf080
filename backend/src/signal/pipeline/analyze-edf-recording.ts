/**
 * The path from a stored EDF/EDF+ file to a run's results, shared by the server's worker and
 * the command line so that both give bit-identical numbers for the same file, settings and
 * IAF: the same streamed reader, the same signals decoded, the same analysis and mapping.
 */
import { normaliseChannelLabel } from '../channels';
import type { EdfRecording, EdfSignalHeader } from '../edf/edf.types';
import type { AnalysisComputationOptions } from './analysis-computation';
import type { AnalysisSettings } from './analysis-settings';
import type { AnalysisResult, OnsetInput, RecordingKindChoice } from './analysis.types';
import { analyzeRecording } from './analyze-recording';
import { EdfFileRead, readEdfFile } from './read-edf-file';
import { AnalyzeOutcome, toAnalyzeOutcome } from './run-summary';

/**
 * The signals `analyzeRecording` analyses: the 10-10 electrodes, or every signal when no
 * label is one (decided from the header alone, before any sample is decoded).
 */
export function isAnalysedSignal(
  signal: EdfSignalHeader,
  _fileIndex: number,
  all: readonly EdfSignalHeader[],
): boolean {
  return (
    normaliseChannelLabel(signal.label) !== null ||
    all.every((s) => normaliseChannelLabel(s.label) === null)
  );
}

/**
 * Reads a file for analysis, streamed from disk: only the analysed signals are decoded, and
 * every chunk goes to `onChunk` (e.g. to hash it) even when the file turns out malformed.
 */
export function readRecordingForAnalysis(
  path: string,
  options: { onChunk?: (chunk: Uint8Array) => void } = {},
): Promise<EdfFileRead> {
  return readEdfFile(path, { selectSignal: isAnalysedSignal, onChunk: options.onChunk });
}

/** One run's inputs besides the recording. */
export interface AnalysisRunRequest {
  kind: RecordingKindChoice;
  /** The effective settings, unchanged. */
  settings: Readonly<AnalysisSettings>;
  /** The visit's resting IAF, Hz, when one exists. */
  iafHz: number | null;
  /** Onsets from the CSV that came with the recording; null: the file's annotations. */
  onsets: readonly OnsetInput[] | null;
}

/** Analysis of a read recording, in the signal core's terms and in Gyre's stored shape. */
export function analyzeEdfRecording(
  recording: EdfRecording,
  request: AnalysisRunRequest,
  options: {
    onProgress?: (fraction: number) => void;
    computation?: AnalysisComputationOptions;
  } = {},
): { result: AnalysisResult; outcome: AnalyzeOutcome } {
  const result = analyzeRecording(
    recording,
    request.settings,
    {
      kind: request.kind,
      iafHz: request.iafHz,
      onsets: request.onsets ?? undefined,
      onProgress: options.onProgress,
    },
    options.computation,
  );
  return { result, outcome: toAnalyzeOutcome(result, recording.warnings) };
}
