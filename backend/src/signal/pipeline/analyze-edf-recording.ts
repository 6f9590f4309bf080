/**
 * The path from a stored EDF/EDF+ file to a run's results, shared by the server's worker and
 * the command line so that both give bit-identical numbers for the same file, settings and
 * IAF: the same streamed reader, the same signals decoded, the same analysis and mapping.
 */
import { open } from 'node:fs/promises';
import { normaliseChannelLabel } from '../channels';
import { EDF_FIXED_HEADER_BYTES, readEdfHeader, requiredHeaderBytes } from '../edf/edf-header';
import type { EdfRecording, EdfSignalHeader } from '../edf/edf.types';
import type { AnalysisComputationOptions } from './analysis-computation';
import { AnalysisInputError } from './analysis-input-error';
import { AnalysisPlan, analysedSignalIndices, planAnalysis } from './analysis-plan';
import type { AnalysisSettings } from './analysis-settings';
import type {
  AnalysisContext,
  AnalysisResult,
  OnsetInput,
  RecordingKindChoice,
} from './analysis.types';
import type { RecordingPart } from './analyze-channels';
import { analyzeRecording } from './analyze-recording';
import { EdfFileRead, readEdfFile, ReadEdfFileOptions } from './read-edf-file';
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

/** Analysed channels [from, to) in file order: one part of a run. */
export interface ChannelRange {
  from: number;
  to: number;
}

/**
 * Reads a file for analysis, streamed from disk: only the analysed signals are decoded (with
 * `channels`, only those analysed channels), and every chunk goes to `onChunk` (e.g. to hash
 * it) even when the file turns out malformed. `warnAboutLeftOut` and `allocateSamples` as
 * `readEdfFile`'s.
 */
export function readRecordingForAnalysis(
  path: string,
  options: {
    onChunk?: (chunk: Uint8Array) => void;
    channels?: ChannelRange;
    warnAboutLeftOut?: boolean;
    /** Buffers for the decoded samples (e.g. a `SampleArena` reused batch after batch). */
    allocateSamples?: ReadEdfFileOptions['allocateSamples'];
  } = {},
): Promise<EdfFileRead> {
  const range = options.channels;
  let analysedOrdinals: Map<EdfSignalHeader, number> | null = null;
  const inRange = (signal: EdfSignalHeader, all: readonly EdfSignalHeader[]): boolean => {
    if (!range) return true;
    analysedOrdinals ??= new Map(
      analysedSignalIndices(all.map((s) => s.label)).map((i, ordinal) => [all[i], ordinal]),
    );
    const ordinal = analysedOrdinals.get(signal);
    return ordinal !== undefined && ordinal >= range.from && ordinal < range.to;
  };
  return readEdfFile(path, {
    selectSignal: (signal, index, all) =>
      isAnalysedSignal(signal, index, all) && inRange(signal, all),
    onChunk: options.onChunk,
    warnAboutLeftOut: options.warnAboutLeftOut,
    allocateSamples: options.allocateSamples,
  });
}

/**
 * The sample count of each channel a run of this file analyses, in file order, from the
 * header alone (a few kilobytes read). Throws `EdfFormatError` for a header that breaks the
 * specification, and the file system's errors.
 */
export async function analysedChannelSamples(path: string): Promise<number[]> {
  const handle = await open(path, 'r');
  try {
    const { size } = await handle.stat();
    const first = new Uint8Array(EDF_FIXED_HEADER_BYTES);
    const { bytesRead } = await handle.read(first, 0, first.byteLength, 0);
    const header = new Uint8Array(requiredHeaderBytes(first.subarray(0, bytesRead)));
    const read = await handle.read(header, 0, header.byteLength, 0);
    const info = readEdfHeader(header.subarray(0, read.bytesRead), size);
    const ordinary = info.signalHeaders.filter((_, i) => !info.annotationSignalIndices.includes(i));
    return analysedSignalIndices(ordinary.map((s) => s.label)).map(
      (i) => info.header.recordCount * ordinary[i].samplesPerRecord,
    );
  } finally {
    await handle.close();
  }
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
  /** Two conditions to compare over the settings' pair (the command line's --compare). */
  compareConditions?: readonly [string, string] | null;
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
    { ...contextOf(request), onProgress: options.onProgress },
    options.computation,
  );
  return { result, outcome: toAnalyzeOutcome(result, recording.warnings) };
}

/**
 * The plan of a run from a file read for analysis with any of its channels decoded
 * (`readRecordingForAnalysis`): the plan `analyzeEdfRecording` makes for the same file.
 */
export function planEdfAnalysis(
  read: EdfFileRead,
  recording: EdfRecording,
  request: AnalysisRunRequest,
  computation?: AnalysisComputationOptions,
): AnalysisPlan {
  const ordinary = read.ordinarySignals ?? [];
  const signals = analysedSignalIndices(ordinary.map((s) => s.label)).map((i) => ordinary[i]);
  return planAnalysis({ ...recording, signals }, request.settings, contextOf(request), computation);
}

/** The decoded channels of a recording read with `channels` (a range), as a part of `plan`. */
export function edfRecordingPart(
  recording: EdfRecording,
  plan: AnalysisPlan,
  channels: ChannelRange,
): RecordingPart {
  const count = channels.to - channels.from;
  if (recording.signals.length !== count || channels.to > plan.channels.length) {
    throw new AnalysisInputError(
      'signals',
      `part: ${recording.signals.length} signals decoded for channels ${channels.from}–${channels.to - 1} of ${plan.channels.length}`,
    );
  }
  return {
    channels: Array.from({ length: count }, (_, i) => channels.from + i),
    signals: recording.signals,
  };
}

/** What a run request tells the analysis about the recording it reads. */
function contextOf(request: AnalysisRunRequest): AnalysisContext {
  return {
    kind: request.kind,
    iafHz: request.iafHz,
    onsets: request.onsets ?? undefined,
    compareConditions: request.compareConditions ?? null,
  };
}
