/**
 * Runs fuzz cases through `validateRecording` in a worker thread and gathers the figures.
 * One case at a time, so each case's time and memory are its own. A worker that does not
 * answer within `hangMs` is terminated and the case reported as a hang; one that dies (out of
 * memory, crash) is reported and replaced; the run goes on either way.
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { Worker } from 'node:worker_threads';
import { buildCase } from './fuzz-cases';
import type { FuzzCase } from './fuzz-cases';
import { judge, NO_FAULTS } from './fuzz-protocol';
import type {
  CaseLimits,
  CaseReply,
  CaseRequest,
  InjectedFaults,
  Judgement,
  ViolationKind,
} from './fuzz-protocol';

/** Heap limit of the worker: the 256 MB budget of a case, enforced by V8. */
const WORKER_OLD_SPACE_MB = 256;
/** Past this a case is a hang, not merely slow (slow is judged against 1 s separately). */
export const DEFAULT_HANG_MS = 5000;

export interface FuzzOptions {
  seed: number;
  /** Case indices to run (e.g. 0..9999, or the one case to replay). */
  indices: readonly number[];
  hangMs?: number;
  /** Time and memory a case may take (default: the contract's 1 s and 256 MB). */
  limits?: CaseLimits;
  /** Misbehaviour on purpose, to test the runner itself; none in a real run. */
  injectFaults?: InjectedFaults;
  /** Called after each case (progress, saving failures). */
  onCase?: (fuzzCase: FuzzCase, result: CaseResult) => void;
}

export interface CaseResult {
  index: number;
  judgement: Judgement;
  elapsedMs: number | null;
  memoryGrowthBytes: number | null;
  /** The rejection's message or the clear error thrown, for the replay of one case. */
  message: string | null;
}

export interface ViolationRecord {
  index: number;
  kind: ViolationKind;
  detail: string;
  shape: string;
  mutation: string;
}

export interface FuzzSummary {
  seed: number;
  cases: number;
  wallMs: number;
  outcomes: Record<string, number>;
  byTarget: Record<string, Record<string, number>>;
  families: Record<string, number>;
  rejectionFields: Array<[string, number]>;
  timeMs: { max: number; p99: number; p50: number; mean: number; slowestCase: number };
  memory: { maxGrowthBytes: number; maxGrowthCase: number; peakRssBytes: number };
  violations: ViolationRecord[];
}

/** Registers an on-the-fly TypeScript compiler in the thread when running from source (jest). */
const FROM_SOURCE = `
const { readFileSync } = require('node:fs');
const swc = require('@swc/core');
require.extensions['.ts'] = function (module, filename) {
  const { code } = swc.transformSync(readFileSync(filename, 'utf8'), {
    filename,
    jsc: { parser: { syntax: 'typescript' }, target: 'es2022' },
    module: { type: 'commonjs' },
  });
  module._compile(code, filename);
};
`;

function spawnWorker(dir: string, faults: InjectedFaults): Worker {
  const options = {
    workerData: { dir, faults },
    resourceLimits: { maxOldGenerationSizeMb: WORKER_OLD_SPACE_MB },
  };
  const compiled = join(__dirname, 'fuzz-worker.js');
  if (existsSync(compiled)) return new Worker(compiled, options);
  // Under jest nothing is compiled: the thread compiles the worker's TypeScript itself.
  const source = join(__dirname, 'fuzz-worker.ts');
  return new Worker(`${FROM_SOURCE}\nrequire(${JSON.stringify(source)});`, {
    ...options,
    eval: true,
  });
}

type WorkerAnswer =
  | { reply: CaseReply }
  | { failure: Extract<ViolationKind, 'hang' | 'memory' | 'crash'>; detail: string };

class CaseWorker {
  private worker: Worker | null = null;

  constructor(
    private readonly dir: string,
    private readonly hangMs: number,
    private readonly faults: InjectedFaults,
  ) {}

  /** A worker that has loaded its modules (compiling them takes seconds under jest). */
  private async ready(): Promise<Worker> {
    if (this.worker !== null) return this.worker;
    const worker = spawnWorker(this.dir, this.faults);
    await new Promise<void>((resolve, reject) => {
      const timer = setTimeout(
        () => reject(new Error('fuzz worker did not start in 60 s')),
        60_000,
      );
      worker.once('message', () => {
        clearTimeout(timer);
        resolve();
      });
      worker.once('error', (error) => {
        clearTimeout(timer);
        reject(error);
      });
    });
    this.worker = worker;
    return worker;
  }

  async run(request: CaseRequest): Promise<WorkerAnswer> {
    const worker = await this.ready();
    const answer = await new Promise<WorkerAnswer>((resolve) => {
      const done = (value: WorkerAnswer): void => {
        clearTimeout(timer);
        worker.off('message', onMessage);
        worker.off('error', onError);
        worker.off('exit', onExit);
        resolve(value);
      };
      const onMessage = (reply: CaseReply): void => done({ reply });
      const onError = (error: Error & { code?: string }): void =>
        done(
          error.code === 'ERR_WORKER_OUT_OF_MEMORY'
            ? { failure: 'memory', detail: `worker heap over ${WORKER_OLD_SPACE_MB} MB` }
            : { failure: 'crash', detail: `${error.name}: ${error.message}\n${error.stack}` },
        );
      const onExit = (code: number): void =>
        done({ failure: 'crash', detail: `worker exited with code ${code}` });
      const timer = setTimeout(
        () => done({ failure: 'hang', detail: `no answer within ${this.hangMs} ms` }),
        this.hangMs,
      );
      worker.on('message', onMessage);
      worker.on('error', onError);
      worker.on('exit', onExit);
      worker.postMessage(request, [request.edf.buffer as ArrayBuffer]);
    });
    if ('failure' in answer) {
      // A thread that hung or died is replaced: the next case starts from a fresh one.
      this.worker = null;
      await worker.terminate().catch(() => undefined);
    }
    return answer;
  }

  async close(): Promise<void> {
    await this.worker?.terminate();
    this.worker = null;
  }
}

function percentile(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return 0;
  // Nearest rank (common practice): the smallest value with at least p of the data at or below.
  return sorted[Math.min(sorted.length - 1, Math.ceil(p * sorted.length) - 1)];
}

export async function runFuzz(options: FuzzOptions): Promise<FuzzSummary> {
  const dir = mkdtempSync(join(tmpdir(), 'gyre-fuzz-'));
  const worker = new CaseWorker(
    dir,
    options.hangMs ?? DEFAULT_HANG_MS,
    options.injectFaults ?? NO_FAULTS,
  );
  const started = performance.now();
  const times: number[] = [];
  const summary: FuzzSummary = {
    seed: options.seed,
    cases: 0,
    wallMs: 0,
    outcomes: {},
    byTarget: {},
    families: {},
    rejectionFields: [],
    timeMs: { max: 0, p99: 0, p50: 0, mean: 0, slowestCase: -1 },
    memory: { maxGrowthBytes: 0, maxGrowthCase: -1, peakRssBytes: process.memoryUsage.rss() },
    violations: [],
  };
  const fields = new Map<string, number>();
  // The whole process's resident memory (this thread and the worker), sampled while cases run.
  const sampler = setInterval(() => {
    summary.memory.peakRssBytes = Math.max(summary.memory.peakRssBytes, process.memoryUsage.rss());
  }, 5);
  try {
    for (const index of options.indices) {
      const fuzzCase = buildCase(options.seed, index);
      const edf = fuzzCase.edf.slice(); // the buffer is moved to the worker
      const answer = await worker.run({
        index,
        edf,
        kind: fuzzCase.kind,
        onsetsCsv: fuzzCase.onsetsCsv,
      });
      const result = resultOf(index, answer, options.limits);
      summary.cases += 1;
      const kind = result.judgement.kind;
      summary.outcomes[kind] = (summary.outcomes[kind] ?? 0) + 1;
      const target = (summary.byTarget[fuzzCase.target] ??= {});
      target[kind] = (target[kind] ?? 0) + 1;
      summary.families[fuzzCase.family] = (summary.families[fuzzCase.family] ?? 0) + 1;
      if (result.judgement.field !== null && kind !== 'violation') {
        fields.set(result.judgement.field, (fields.get(result.judgement.field) ?? 0) + 1);
      }
      if (result.elapsedMs !== null) {
        times.push(result.elapsedMs);
        if (result.elapsedMs > summary.timeMs.max) {
          summary.timeMs.max = result.elapsedMs;
          summary.timeMs.slowestCase = index;
        }
      }
      if (
        result.memoryGrowthBytes !== null &&
        result.memoryGrowthBytes > summary.memory.maxGrowthBytes
      ) {
        summary.memory.maxGrowthBytes = result.memoryGrowthBytes;
        summary.memory.maxGrowthCase = index;
      }
      for (const v of result.judgement.violations) {
        summary.violations.push({
          index,
          kind: v.kind,
          detail: v.detail,
          shape: fuzzCase.shape,
          mutation: fuzzCase.mutation,
        });
      }
      summary.memory.peakRssBytes = Math.max(
        summary.memory.peakRssBytes,
        process.memoryUsage.rss(),
      );
      options.onCase?.(fuzzCase, result);
    }
  } finally {
    clearInterval(sampler);
    await worker.close();
    rmSync(dir, { recursive: true, force: true });
  }
  const sorted = times.slice().sort((a, b) => a - b);
  summary.timeMs.p99 = percentile(sorted, 0.99);
  summary.timeMs.p50 = percentile(sorted, 0.5);
  summary.timeMs.mean = sorted.reduce((s, t) => s + t, 0) / Math.max(1, sorted.length);
  summary.rejectionFields = [...fields.entries()].sort((a, b) => b[1] - a[1]);
  summary.wallMs = performance.now() - started;
  return summary;
}

function resultOf(index: number, answer: WorkerAnswer, limits?: CaseLimits): CaseResult {
  if ('failure' in answer) {
    return {
      index,
      judgement: {
        kind: 'violation',
        field: null,
        violations: [{ kind: answer.failure, detail: answer.detail }],
      },
      elapsedMs: null,
      memoryGrowthBytes: null,
      message: null,
    };
  }
  const { reply } = answer;
  const message =
    reply.thrown !== null
      ? `${reply.thrown.constructorName}: ${reply.thrown.message}`
      : reply.outcome !== null && !reply.outcome.ok
        ? reply.outcome.message
        : null;
  return {
    index,
    judgement: judge(reply, limits),
    elapsedMs: reply.elapsedMs,
    memoryGrowthBytes: reply.memoryGrowthBytes,
    message,
  };
}

export function rangeOf(first: number, count: number): number[] {
  return Array.from({ length: count }, (_, i) => first + i);
}
