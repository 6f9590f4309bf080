import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { DEFAULT_ANALYSIS_SETTINGS } from '../signal/pipeline/analysis-settings';
import type { AnalyzeTask } from './worker/worker-tasks';

/**
 * A task recording computed with Gyre's default settings, no onset CSV and no resting IAF:
 * what the worker's tests and the stage benchmarks run.
 */
export function defaultAnalyzeTask(file: { path: string; checksumSha256: string }): AnalyzeTask {
  return {
    filePath: file.path,
    checksumSha256: file.checksumSha256,
    kind: 'task',
    csvOnsets: null,
    settings: { ...DEFAULT_ANALYSIS_SETTINGS },
    iafHz: null,
  };
}

/** The same for a file on disk, hashed first (SHA-256, read as a stream). */
export async function defaultAnalyzeTaskOfFile(path: string): Promise<AnalyzeTask> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  return defaultAnalyzeTask({ path, checksumSha256: hash.digest('hex') });
}
