import { createHash } from 'node:crypto';
import {
  analyzeEdfRecording,
  readRecordingForAnalysis,
} from '../../signal/pipeline/analyze-edf-recording';
import type { AnalyzeOutcome, AnalyzeTask } from './worker-tasks';

/**
 * One computation in a worker thread: read the stored file, check it is the file the run
 * names (SHA-256), then run the signal core's one path from file to results with the
 * effective settings and the visit's IAF as they came (the core resolves the band), so the
 * command line gives the same numbers for the same file.
 */
export async function runAnalysis(
  task: Omit<AnalyzeTask, 'progressPort'>,
  onProgress: (percent: number) => void,
): Promise<AnalyzeOutcome> {
  // Streamed from disk: the file is hashed and decoded chunk by chunk, and only the
  // channels the analysis uses are decoded (never the whole file in memory).
  const hash = createHash('sha256');
  const read = await readRecordingForAnalysis(task.filePath, {
    onChunk: (chunk) => hash.update(chunk),
  });
  const actual = hash.digest('hex');
  if (actual !== task.checksumSha256) {
    throw new Error(
      `stored file: SHA-256 ${actual} found, ${task.checksumSha256} expected (the file changed on disk)`,
    );
  }
  onProgress(2);
  const recording = read.finish();
  onProgress(5);
  const { outcome } = analyzeEdfRecording(
    recording,
    {
      kind: task.kind === 'task' ? 'task' : 'rest',
      settings: task.settings,
      iafHz: task.iafHz,
      onsets: task.csvOnsets,
    },
    { onProgress: (fraction) => onProgress(5 + 94 * fraction) },
  );
  return outcome;
}
