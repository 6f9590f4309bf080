import { availableParallelism } from 'node:os';
import { MessageChannel } from 'node:worker_threads';
import { Inject, Injectable, OnModuleDestroy, Optional } from '@nestjs/common';
import { Piscina } from 'piscina';
import { channelPartBuffers } from '../signal/pipeline/analyze-channels';
import { analysisWorkerFile } from './worker/worker-file';
import { AnalysisRunner, layoutFor, PartReport, runAnalysisInParts } from './worker/run-analysis';
import type {
  AnalyzeOutcome,
  AnalyzePartTask,
  AnalyzeTask,
  MergeTask,
  PartOutcome,
  ValidateOutcome,
  ValidateTask,
} from './worker/worker-tasks';

/** Optional provider: the number of analysis threads (default: one per core). */
export const ANALYSIS_THREADS = Symbol('ANALYSIS_THREADS');

/**
 * Worker threads for everything heavy, in lanes of their own: analyses get as many threads
 * as the machine has cores, and one recording is cut into as many parts (by channels) so it
 * uses every core; merging the parts of a computation has its own thread, so a merge never
 * waits behind the parts of other recordings (and never for a thread it holds); validation
 * of uploads has its own thread, so an upload is checked at once even while every core is
 * computing (it reads the file once and is short).
 */
@Injectable()
export class WorkerPoolService implements OnModuleDestroy {
  readonly analysisThreads: number;
  private readonly analysisPool: Piscina;
  private readonly mergePool: Piscina;
  private readonly validationPool: Piscina;

  constructor(@Optional() @Inject(ANALYSIS_THREADS) threads?: number) {
    this.analysisThreads = Math.max(1, Math.floor(threads ?? availableParallelism()));
    const lane = (maxThreads: number): Piscina =>
      new Piscina({
        filename: analysisWorkerFile(),
        minThreads: 0,
        maxThreads,
        idleTimeout: 30_000,
        // Analyses hold many channels in memory: never stack tasks on one thread.
        concurrentTasksPerWorker: 1,
      });
    this.analysisPool = lane(this.analysisThreads);
    this.mergePool = lane(1);
    this.validationPool = lane(1);
  }

  validate(task: ValidateTask): Promise<ValidateOutcome> {
    return this.validationPool.run(task, { name: 'validate' }) as Promise<ValidateOutcome>;
  }

  /**
   * Runs one analysis as one part per analysis thread (at most one per channel), then their
   * merge; `onProgress` gets 0–100 as the parts report it, `onPart` each part when it ends.
   */
  async analyze(
    task: AnalyzeTask,
    onProgress: (percent: number) => void,
    options: { onPart?: (report: PartReport) => void } = {},
  ): Promise<AnalyzeOutcome> {
    const layout = await layoutFor(task.filePath, this.analysisThreads);
    return runAnalysisInParts(task, layout, this.runner, onProgress, options.onPart);
  }

  private readonly runner: AnalysisRunner = {
    part: async (task, onProgress, signal) => {
      const channel = new MessageChannel();
      channel.port1.on('message', (value: unknown) => {
        if (typeof value === 'number' && Number.isFinite(value)) onProgress(value);
      });
      try {
        const full: AnalyzePartTask = { ...task, progressPort: channel.port2 };
        return (await this.analysisPool.run(full, {
          name: 'part',
          transferList: [channel.port2],
          signal,
        })) as PartOutcome;
      } finally {
        channel.port1.close();
      }
    },
    merge: async (task: MergeTask) =>
      (await this.mergePool.run(task, {
        name: 'merge',
        transferList: channelPartBuffers(task.parts.flat()),
      })) as AnalyzeOutcome,
  };

  async onModuleDestroy(): Promise<void> {
    await Promise.all([
      this.analysisPool.close({ force: true }),
      this.mergePool.close({ force: true }),
      this.validationPool.close({ force: true }),
    ]);
  }
}
