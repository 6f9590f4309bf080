/**
 * One worker process: a BullMQ Worker on Gyre's analysis queue. For each job it asks the
 * server for the task, downloads the stored recording into a temporary folder (checking its
 * size and SHA-256), computes it with the server's own code (the worker-thread pool of jobs/,
 * so the event loop stays free to renew BullMQ's lock), posts progress and the result, and
 * removes the file. A computation that fails is reported and counts as an attempt; a hiccup
 * talking to the server is thrown, so BullMQ retries the job; a worker that dies leaves its
 * job to BullMQ's stalled-job recovery, and another worker takes it.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { Job, Worker } from 'bullmq';
import type { Redis } from 'ioredis';
import { WorkerPoolService } from '../jobs/worker-pool.service';
import { GYRE_VERSION } from '../version';
import {
  ANALYSIS_QUEUE,
  analyzeTaskOf,
  openRedis,
  parseRemoteJobId,
  RemoteJobData,
} from './remote-job';
import { encodeResultBody } from './result-wire';
import { WorkerApiClient, WorkerApiError } from './worker-api-client';
import type { WorkerSettings } from './worker-settings';
import { threadErrorMessage } from '../common/errors/error-message';

/** Progress goes to the server at most this often per job. */
const PROGRESS_INTERVAL_MS = 1000;

export type WorkerLog = (line: string) => void;

export class RemoteWorker {
  private readonly pool = new WorkerPoolService();
  private readonly client: WorkerApiClient;
  private worker: Worker<RemoteJobData> | null = null;
  private redis: Redis | null = null;

  constructor(
    private readonly settings: WorkerSettings,
    private readonly log: WorkerLog,
    /** Called once when the server refuses the token: this worker must stop taking jobs. */
    private readonly onTokenRefused: (message: string) => void = () => undefined,
  ) {
    this.client = new WorkerApiClient(settings);
  }

  /** Checks the server is reachable and of the same version, then starts taking jobs. */
  async start(): Promise<void> {
    const health = await this.client.health().catch((error: unknown) => {
      throw new Error(`the server at ${this.settings.serverUrl} does not answer: ${String(error)}`);
    });
    if (health.version !== GYRE_VERSION) {
      throw new Error(
        `the server runs Gyre ${health.version} and this worker ${GYRE_VERSION}: install the same version on both`,
      );
    }
    await this.client.checkToken().catch((error: unknown) => {
      throw new Error(`the server refuses this worker: ${String(error)}`, { cause: error });
    });
    this.redis = openRedis(this.settings.redisUrl);
    this.worker = new Worker<RemoteJobData>(ANALYSIS_QUEUE, (job) => this.process(job), {
      connection: this.redis,
      concurrency: this.settings.concurrency,
      lockDuration: this.settings.lockMs,
      stalledInterval: this.settings.stalledIntervalMs,
      maxStalledCount: this.settings.maxStalled,
      name: this.settings.name,
    });
    this.worker.on('error', (error) => this.log(`Redis: ${error.message}`));
    this.worker.on('failed', (job, error) =>
      this.log(`job ${job?.id ?? '?'} attempt failed in the queue: ${error.message}`),
    );
    await this.worker.waitUntilReady();
    this.log(
      `ready: ${this.settings.concurrency} at once, server ${this.settings.serverUrl}, Gyre ${GYRE_VERSION}`,
    );
  }

  /** Finishes the jobs in hand (or, forced, abandons them to stalled-job recovery), then stops. */
  async close(force = false): Promise<void> {
    await this.worker?.close(force);
    await this.redis?.quit().catch(() => this.redis?.disconnect());
    await this.pool.onModuleDestroy();
  }

  private async process(job: Job<RemoteJobData>): Promise<string> {
    try {
      return await this.compute(job);
    } catch (error) {
      // A revoked token would fail every job it takes: stop instead, and let others take them.
      if (error instanceof WorkerApiError && error.tokenRefused) this.onTokenRefused(error.message);
      throw error;
    }
  }

  private async compute(job: Job<RemoteJobData>): Promise<string> {
    const ref = parseRemoteJobId(job.id);
    if (ref === null) throw new Error(`job id ${String(job.id)} is not one Gyre made`);
    const started = performance.now();
    const seconds = (): string => ((performance.now() - started) / 1000).toFixed(1);
    this.log(`took job ${job.id} (recording ${job.data.recordingId}, ${job.data.kind})`);
    const folder = await mkdtemp(join(tmpdir(), 'gyre-worker-'));
    try {
      const task = await this.client.input(ref).catch((error: unknown) => {
        if (error instanceof WorkerApiError && error.notCurrent) return error;
        throw error;
      });
      if (task instanceof WorkerApiError) {
        this.log(`finished job ${job.id} in ${seconds()} s: dropped (${task.message})`);
        return 'not current';
      }
      if (task.gyreVersion !== GYRE_VERSION) {
        throw new Error(
          `the server now runs Gyre ${task.gyreVersion}, this worker ${GYRE_VERSION}`,
        );
      }
      const filePath = join(folder, 'recording.edf');
      await this.client.download(ref, filePath, task.checksumSha256, task.fileBytes);
      let outcome;
      try {
        outcome = await this.pool.analyze(
          analyzeTaskOf(task, filePath),
          this.progressReporter(ref),
        );
      } catch (error) {
        const message = threadErrorMessage(error);
        await this.postFailure(ref, message, job.id);
        this.log(`finished job ${job.id} in ${seconds()} s: computation failed (${message})`);
        return 'failed';
      }
      try {
        const answer = await this.client.result(ref, encodeResultBody(outcome, GYRE_VERSION));
        const what = answer.duplicate
          ? 'stored before'
          : answer.newRun
            ? 'new run'
            : 'same numbers';
        this.log(`finished job ${job.id} in ${seconds()} s: run ${answer.runId ?? '-'} (${what})`);
        return answer.runId ?? 'stored';
      } catch (error) {
        if (!(error instanceof WorkerApiError)) throw error;
        if (error.notCurrent) {
          this.log(`finished job ${job.id} in ${seconds()} s: dropped (${error.message})`);
          return 'not current';
        }
        if (!error.refused) throw error;
        await this.postFailure(ref, `the server refused the result: ${error.message}`, job.id);
        this.log(`finished job ${job.id} in ${seconds()} s: result refused (${error.message})`);
        return 'refused';
      }
    } finally {
      await rm(folder, { recursive: true, force: true });
    }
  }

  private async postFailure(
    ref: { jobId: string; attempt: number },
    message: string,
    id: string | undefined,
  ): Promise<void> {
    try {
      await this.client.failure(ref, message);
    } catch (error) {
      if (error instanceof WorkerApiError && error.notCurrent) return;
      this.log(`job ${id ?? '?'}: could not report the failure: ${String(error)}`);
      throw error;
    }
  }

  /** Posts whole percents, at most one a second, without waiting for the answers. */
  private progressReporter(ref: { jobId: string; attempt: number }): (percent: number) => void {
    let sentAt = 0;
    let last = -1;
    return (percent: number) => {
      const whole = Math.floor(percent);
      const now = Date.now();
      if (whole <= last || now - sentAt < PROGRESS_INTERVAL_MS) return;
      last = whole;
      sentAt = now;
      this.client.progress(ref, whole).catch(() => undefined);
    };
  }
}
