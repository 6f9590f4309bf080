import { Inject, Injectable, Logger, OnModuleDestroy } from '@nestjs/common';
import { Queue, QueueEvents } from 'bullmq';
import type { Redis } from 'ioredis';
import type { AppConfig, RemoteConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import {
  ANALYSIS_QUEUE,
  ANALYZE_JOB_NAME,
  AttemptRef,
  openRedis,
  remoteJobId,
  RemoteJobData,
} from '../remote-workers/remote-job';

/** How long the server waits for Redis at start before it gives up with a clear message. */
const CONNECT_TIMEOUT_MS = 15_000;

/** Where an attempt handed to Redis stands. */
export type RemoteState =
  /** Waiting for a worker, being computed, or waiting for BullMQ's retry after a hiccup. */
  | { kind: 'in-flight' }
  /** Not in Redis (Redis lost it, or it was never added): it must be handed over again. */
  | { kind: 'gone' }
  /** BullMQ gave up on it (its worker died too often, or it could not reach the server). */
  | { kind: 'failed'; reason: string }
  /** A worker finished it without a result reaching the server. */
  | { kind: 'completed' };

/**
 * The server's side of BullMQ (with REDIS_URL): hands prepared computations to Redis, one
 * BullMQ job per attempt, and says where each stands. Workers (`npm run worker`) take them,
 * fetch inputs and post results over the worker API; the SQLite job stays the record of the
 * computation, so nothing here decides a job's or a recording's state.
 */
@Injectable()
export class RemoteComputationsService implements OnModuleDestroy {
  private readonly logger = new Logger('RemoteComputationsService');
  private readonly settings: RemoteConfig | null;
  private queue: Queue<RemoteJobData> | null = null;
  private events: QueueEvents | null = null;
  private redis: Redis | null = null;

  constructor(@Inject(APP_CONFIG) config: AppConfig) {
    this.settings = config.remote;
  }

  /** True with REDIS_URL: this server computes nothing itself. */
  get enabled(): boolean {
    return this.settings !== null;
  }

  get dispatchLimit(): number {
    return this.settings?.dispatchLimit ?? 0;
  }

  get checkIntervalMs(): number {
    return this.settings?.checkIntervalMs ?? 0;
  }

  /** Connects to Redis (or fails the start, naming the URL's host); `onFailed` hears of failures. */
  async start(onFailed: () => void): Promise<void> {
    if (this.settings === null) return;
    const connection = openRedis(this.settings.redisUrl);
    this.redis = connection;
    this.queue = new Queue<RemoteJobData>(ANALYSIS_QUEUE, {
      connection,
      defaultJobOptions: {
        // Retries of the worker's own hiccups (the server unreachable for a moment); a failed
        // computation is reported by the worker and counted as an attempt of the SQLite job.
        attempts: 4,
        backoff: { type: 'exponential', delay: 2000 },
        removeOnComplete: { age: 24 * 3600, count: 5000 },
        removeOnFail: { age: 7 * 24 * 3600 },
      },
    });
    this.queue.on('error', (error) => this.logger.warn(`Redis: ${error.message}`));
    this.events = new QueueEvents(ANALYSIS_QUEUE, { connection });
    this.events.on('error', (error) => this.logger.warn(`Redis (events): ${error.message}`));
    this.events.on('failed', () => onFailed());
    const ready = Promise.all([this.queue.waitUntilReady(), this.events.waitUntilReady()]);
    const timeout = new Promise<never>((_resolve, reject) =>
      setTimeout(
        () =>
          reject(
            new Error(
              `REDIS_URL: no answer from Redis at ${hostOf(this.settings?.redisUrl)} within ${CONNECT_TIMEOUT_MS / 1000} s`,
            ),
          ),
        CONNECT_TIMEOUT_MS,
      ).unref(),
    );
    await Promise.race([ready, timeout]);
    this.logger.log(`Computations go to Redis at ${hostOf(this.settings.redisUrl)}`);
  }

  /** Hands one attempt to Redis; adding the same attempt twice leaves one BullMQ job. */
  async dispatch(data: RemoteJobData): Promise<void> {
    await this.connected().add(ANALYZE_JOB_NAME, data, { jobId: remoteJobId(data) });
  }

  /** Hands an attempt over again after Redis lost it, or after BullMQ finished it without result. */
  async redispatch(data: RemoteJobData): Promise<void> {
    const existing = await this.connected().getJob(remoteJobId(data));
    if (existing !== undefined) await existing.remove();
    await this.dispatch(data);
  }

  async state(ref: AttemptRef): Promise<RemoteState> {
    const job = await this.connected().getJob(remoteJobId(ref));
    if (job === undefined) return { kind: 'gone' };
    const state = await job.getState();
    if (state === 'unknown') return { kind: 'gone' };
    if (state === 'failed') return { kind: 'failed', reason: job.failedReason };
    if (state === 'completed') return { kind: 'completed' };
    return { kind: 'in-flight' };
  }

  /** The data an attempt was dispatched with; null when Redis no longer has it. */
  async data(ref: AttemptRef): Promise<RemoteJobData | null> {
    const job = await this.connected().getJob(remoteJobId(ref));
    return job?.data ?? null;
  }

  async onModuleDestroy(): Promise<void> {
    // With Redis away, closing would wait for it: give up after a few seconds.
    const closed = Promise.allSettled([this.events?.close(), this.queue?.close()]).then(() =>
      this.redis?.quit(),
    );
    await Promise.race([closed.catch(() => undefined), delay(3000)]);
    this.redis?.disconnect();
  }

  private connected(): Queue<RemoteJobData> {
    if (this.queue === null) throw new Error('Remote computations are not started');
    return this.queue;
  }
}

function delay(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms).unref());
}

/** host:port of a Redis URL, never its password. */
function hostOf(url: string | undefined): string {
  try {
    const parsed = new URL(url ?? '');
    return parsed.host;
  } catch {
    return 'REDIS_URL';
  }
}
