/**
 * The module each worker thread of the pool loads (see worker-file.ts). Exports one
 * function per task name; piscina calls them with the task object.
 */
import { move, transferableSymbol, valueSymbol } from 'piscina';
import { channelPartBuffers } from '../../signal/pipeline/analyze-channels';
import { analyzePart } from './analyze-part';
import { mergeParts } from './run-analysis';
import { validateRecording } from './validate-recording';
import type { AnalyzePartTask, MergeTask, ValidateOutcome, ValidateTask } from './worker-tasks';

export function validate(task: ValidateTask): Promise<ValidateOutcome> {
  return validateRecording(task);
}

/** Moves `buffers` with `value` to the receiving thread instead of copying them. */
function moved(value: object, buffers: ArrayBuffer[]): unknown {
  // A transferable wrapper must also be marked movable (piscina's move) to be unwrapped.
  return move({ [transferableSymbol]: buffers, [valueSymbol]: value });
}

/** Runs one part of an analysis; its typed arrays are moved to the main thread. */
export async function part(task: AnalyzePartTask): Promise<unknown> {
  const port = task.progressPort;
  try {
    const outcome = await analyzePart(task, (fraction) => port?.postMessage(fraction));
    return moved(outcome, channelPartBuffers(outcome.channels));
  } finally {
    port?.close();
  }
}

/** Merges the parts of an analysis; the result's series are moved to the main thread. */
export function merge(task: MergeTask): unknown {
  const outcome = mergeParts(task);
  return moved(
    outcome,
    Object.values(outcome.series).map((values) => values.buffer as ArrayBuffer),
  );
}
