/**
 * The module each worker thread of the pool loads (see worker-file.ts). Exports one
 * function per task name; piscina calls them with the task object.
 */
import { move, transferableSymbol, valueSymbol } from 'piscina';
import { runAnalysis } from './run-analysis';
import { validateRecording } from './validate-recording';
import type { AnalyzeTask, ValidateOutcome, ValidateTask } from './worker-tasks';

export function validate(task: ValidateTask): Promise<ValidateOutcome> {
  return validateRecording(task);
}

/** Runs one analysis; the typed arrays of the result are moved to the main thread, not copied. */
export async function analyze(task: AnalyzeTask): Promise<unknown> {
  try {
    const outcome = await runAnalysis(task, (percent) => task.progressPort.postMessage(percent));
    const buffers = Object.values(outcome.series).map((values) => values.buffer);
    // A transferable wrapper must also be marked movable (piscina's move) to be unwrapped.
    return move({ [transferableSymbol]: buffers, [valueSymbol]: outcome });
  } finally {
    task.progressPort.close();
  }
}
