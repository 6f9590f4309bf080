import { availableParallelism } from 'node:os';
import { MessageChannel } from 'node:worker_threads';
import { Injectable, OnModuleDestroy } from '@nestjs/common';
import { Piscina } from 'piscina';
import { analysisWorkerFile } from './worker/worker-file';
import type {
  AnalyzeOutcome,
  AnalyzeTask,
  ValidateOutcome,
  ValidateTask,
} from './worker/worker-tasks';

/**
 * Worker threads for everything heavy, in two lanes of their own: analyses get as many threads
 * as the machine has cores; validation of uploads has its own thread, so an upload is checked
 * at once even while every core is computing (it reads the file once and is short).
 */
@Injectable()
export class WorkerPoolService implements OnModuleDestroy {
  readonly analysisThreads = Math.max(1, availableParallelism());
  private readonly analysisPool = new Piscina({
    filename: analysisWorkerFile(),
    minThreads: 0,
    maxThreads: this.analysisThreads,
    idleTimeout: 30_000,
    // Analyses hold whole recordings in memory: never stack tasks on one thread.
    concurrentTasksPerWorker: 1,
  });
  private readonly validationPool = new Piscina({
    filename: analysisWorkerFile(),
    minThreads: 0,
    maxThreads: 1,
    idleTimeout: 30_000,
    concurrentTasksPerWorker: 1,
  });

  validate(task: ValidateTask): Promise<ValidateOutcome> {
    return this.validationPool.run(task, { name: 'validate' }) as Promise<ValidateOutcome>;
  }

  /** Runs one analysis; `onProgress` gets 0–100 as the worker reports it. */
  async analyze(
    task: Omit<AnalyzeTask, 'progressPort'>,
    onProgress: (percent: number) => void,
  ): Promise<AnalyzeOutcome> {
    const channel = new MessageChannel();
    channel.port1.on('message', (value: unknown) => {
      if (typeof value === 'number' && Number.isFinite(value)) onProgress(value);
    });
    try {
      const full: AnalyzeTask = { ...task, progressPort: channel.port2 };
      return (await this.analysisPool.run(full, {
        name: 'analyze',
        transferList: [channel.port2],
      })) as AnalyzeOutcome;
    } finally {
      channel.port1.close();
    }
  }

  async onModuleDestroy(): Promise<void> {
    await Promise.all([
      this.analysisPool.close({ force: true }),
      this.validationPool.close({ force: true }),
    ]);
  }
}
