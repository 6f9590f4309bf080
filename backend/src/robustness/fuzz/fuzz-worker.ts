/**
 * The fuzz runner's worker thread: writes each case to a file and runs the server's own
 * validation (`validateRecording`, the function the validation lane runs) on it. In a thread
 * of its own so that the runner can stop it when a case hangs, and so that its heap has a
 * limit of its own (`resourceLimits`): a case that runs away is reported, not fatal.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { parentPort, workerData } from 'node:worker_threads';
import { validateRecording } from '../../jobs/worker/validate-recording';
import { EdfFormatError } from '../../signal/edf';
import { OnsetCsvError } from '../../signal/onsets';
import type { CaseReply, CaseRequest, InjectedFaults, ThrownError } from './fuzz-protocol';

// An emptied young generation before each case, so the growth measured is the case's own.
// A minor collection costs well under a millisecond where a full one costs ~15 ms, which
// would triple the run; large buffers live outside the young generation and are counted
// either way. (The flag set at run time is how gc() is reached without --expose-gc.)
setFlagsFromString('--expose-gc');
const collect = runInNewContext('gc') as (options?: { type: 'minor' | 'major' }) => void;

const data = workerData as { dir: string; faults: InjectedFaults };
// The runner owns the folder (and deletes it): a terminated thread cleans up nothing.
const file = join(data.dir, 'case.edf');

/** Faults on purpose, for the runner's own test: that a hang, a heap overflow and a stray
 * exception are each reported as such and the run goes on. Empty in every real run. */
function injectFault(index: number): void {
  if (data.faults.hang.includes(index)) for (;;);
  if (data.faults.heap.includes(index)) {
    const kept: number[][] = [];
    for (;;) kept.push(new Array<number>(100_000).fill(index));
  }
  if (data.faults.exception.includes(index)) throw new TypeError(`fault injected in case ${index}`);
}

function footprint(): number {
  const usage = process.memoryUsage();
  return usage.heapUsed + usage.arrayBuffers;
}

function flatten(error: unknown): ThrownError {
  const e = error instanceof Error ? error : new Error(String(error));
  const clear = error instanceof EdfFormatError || error instanceof OnsetCsvError;
  return {
    constructorName: (error as object | null)?.constructor?.name ?? typeof error,
    message: e.message,
    stack: e.stack ?? '',
    clear,
    field:
      error instanceof EdfFormatError
        ? error.field
        : error instanceof OnsetCsvError
          ? `onsets line ${error.line}`
          : null,
  };
}

async function run(request: CaseRequest): Promise<CaseReply> {
  writeFileSync(file, request.edf);
  collect({ type: 'minor' });
  const before = footprint();
  const started = performance.now();
  let reply: Pick<CaseReply, 'outcome' | 'thrown'>;
  try {
    injectFault(request.index);
    reply = {
      outcome: await validateRecording({
        filePath: file,
        kind: request.kind,
        onsetsCsv: request.onsetsCsv,
      }),
      thrown: null,
    };
  } catch (error) {
    reply = { outcome: null, thrown: flatten(error) };
  }
  const elapsedMs = performance.now() - started;
  const memoryGrowthBytes = Math.max(0, footprint() - before);
  return { index: request.index, elapsedMs, memoryGrowthBytes, ...reply };
}

parentPort?.on('message', (request: CaseRequest) => {
  void run(request).then((reply) => parentPort?.postMessage(reply));
});
// Loaded (and, from source, compiled): the runner starts the clock of the first case only now.
parentPort?.postMessage('ready');
