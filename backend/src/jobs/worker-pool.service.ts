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
 * One piscina pool of worker threads, as wide as the machine's cores, for everything
 * heavy: full validation of uploads and the analyses. The event loop only moves bytes.
 */
@Injectable()
export class WorkerPoolService implements OnModuleDestroy {
  readonly threads = Math.max(1, availableParallelism());
  private readonly pool = new Piscina({
    filename: analysisWorkerFile(),
    minThreads: 0,
    maxThreads: this.threads,
    idleTimeout: 30_000,
    // Analyses hold whole recordings in memory: never stack tasks on one thread.
    concurrentTasksPerWorker: 1,
  });

  validate(task: ValidateTask): Promise<ValidateOutcome> {
    return this.pool.run(task, { name: 'validate' }) as Promise<ValidateOutcome>;
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
      return (await this.pool.run(full, {
        name: 'analyze',
        transferList: [channel.port2],
      })) as AnalyzeOutcome;
    } finally {
      channel.port1.close();
    }
  }

  async onModuleDestroy(): Promise<void> {
    await this.pool.close({ force: true });
  }
}
