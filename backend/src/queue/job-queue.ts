import type { EntityManager } from 'typeorm';
import type { JobState } from '@gyre/shared';

/** Injection token of the queue implementation (the SQLite table by default). */
export const JOB_QUEUE = Symbol('JOB_QUEUE');

/** A job as producers and consumers see it; the payload is the producer's own JSON. */
export interface QueuedJob<P = unknown> {
  id: string;
  lane: string;
  subjectId: string;
  payload: P;
  state: JobState;
  attempts: number;
  maxAttempts: number;
  progressPercent: number;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

export interface EnqueueRequest<P> {
  lane: string;
  subjectId: string;
  payload: P;
  maxAttempts?: number;
}

/** What `fail` decided: another attempt later, or no more. */
export interface FailOutcome {
  willRetry: boolean;
  attempts: number;
  maxAttempts: number;
}

/** A job a stopped process left running, and what became of it. */
export interface RecoveredJob {
  job: QueuedJob;
  willRetry: boolean;
}

/** What `recover` leaves alone. */
export interface RecoverOptions {
  /**
   * Running jobs that are still being computed elsewhere (by remote workers, whose queue
   * outlives this process): they stay `running`.
   */
  stillRunning?: ReadonlySet<string>;
}

/**
 * The job queue behind one interface, knowing nothing of what jobs do. `enqueue` writes inside
 * the producer's transaction, so a job exists exactly when the change that asked for it commits
 * (an implementation on an external queue would keep an outbox in that transaction). `claim`
 * counts an attempt; `fail` re-queues until `maxAttempts`; `release` hands a claimed job back
 * without counting the attempt; `recover` settles jobs a stopped process left running.
 */
export interface JobQueue {
  enqueue<P>(tx: EntityManager, request: EnqueueRequest<P>): Promise<QueuedJob<P>>;
  claim<P>(lane: string): Promise<QueuedJob<P> | null>;
  progress(jobId: string, percent: number): Promise<void>;
  complete(tx: EntityManager, jobId: string): Promise<void>;
  fail(tx: EntityManager, jobId: string, error: string): Promise<FailOutcome>;
  release(jobId: string, delayMs: number): Promise<void>;
  recover(options?: RecoverOptions): Promise<RecoveredJob[]>;
  /** One job by id, inside a transaction when one is given (so a check and a write agree). */
  byId<P>(jobId: string, tx?: EntityManager): Promise<QueuedJob<P> | null>;
  /** The lane's running jobs, oldest first. */
  running<P>(lane: string): Promise<Array<QueuedJob<P>>>;
  /** The newest job of each subject. */
  latestBySubject(subjectIds: readonly string[]): Promise<Map<string, QueuedJob>>;
  /** Jobs queued or running, in one lane or all. */
  activeCount(lane?: string): Promise<number>;
  /** When the lane's earliest waiting (released) job becomes due, ms from now; null if none waits. */
  nextDueInMs(lane: string): Promise<number | null>;
}
