import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { CalibrationFile } from './calibration-signal';

/** Where a run's two generated files live: `<DATA_DIR>/calibration/<runId>/`, never in uploads. */
export function calibrationFilePaths(
  dataDir: string,
  runId: string,
): { dir: string; rest: string; task: string } {
  const dir = join(dataDir, 'calibration', runId);
  return { dir, rest: join(dir, 'rest.edf'), task: join(dir, 'task.edf') };
}

/** Writes both files (owner-only, like every file Gyre keeps). */
export function writeCalibrationFiles(
  dataDir: string,
  runId: string,
  files: { rest: CalibrationFile; task: CalibrationFile },
): void {
  const paths = calibrationFilePaths(dataDir, runId);
  mkdirSync(paths.dir, { recursive: true, mode: 0o700 });
  writeFileSync(paths.rest, files.rest.bytes, { mode: 0o600 });
  writeFileSync(paths.task, files.task.bytes, { mode: 0o600 });
}

export function removeCalibrationFiles(dataDir: string, runId: string): void {
  rmSync(calibrationFilePaths(dataDir, runId).dir, { recursive: true, force: true });
}
