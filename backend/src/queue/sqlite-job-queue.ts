// Hand-written: the embedded default must run with nothing to install, and SQLite is already
// Gyre's store; BullMQ on Redis is the implementation for more than one machine.
import { randomUUID } from 'node:crypto';
import { Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, In } from 'typeorm';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import type {
  EnqueueRequest,
  FailOutcome,
  JobQueue,
  QueuedJob,
  RecoveredJob,
  RecoverOptions,
} from './job-queue';
import { QueueJob } from './queue-job.entity';

const DEFAULT_MAX_ATTEMPTS = 3;

/** The queue as the `job` table of Gyre's SQLite file: jobs survive restarts with the data. */
@Injectable()
export class SqliteJobQueue implements JobQueue {
  private readonly logger = new Logger('Queue');

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
  ) {}

  async enqueue<P>(tx: EntityManager, request: EnqueueRequest<P>): Promise<QueuedJob<P>> {
    const now = nowIso();
    const row = Object.assign(new QueueJob(), {
      id: randomUUID(),
      lane: request.lane,
      subjectId: request.subjectId,
      payloadJson: JSON.stringify(request.payload),
      state: 'queued' as const,
      attempts: 0,
      maxAttempts: request.maxAttempts ?? DEFAULT_MAX_ATTEMPTS,
      progressPercent: 0,
      error: null,
      runAfter: now,
      createdAt: now,
      startedAt: null,
      finishedAt: null,
    });
    await tx.getRepository(QueueJob).insert(row);
    return toQueuedJob<P>(row);
  }

  /** The oldest due job of the lane, marked running with one more attempt, in one write. */
  claim<P>(lane: string): Promise<QueuedJob<P> | null> {
    return this.writes.run(async (tx) => {
      const row = await tx
        .getRepository(QueueJob)
        .createQueryBuilder('j')
        .where('j.lane = :lane AND j.state = :state AND j.runAfter <= :now', {
          lane,
          state: 'queued',
          now: nowIso(),
        })
        .orderBy('j.createdAt', 'ASC')
        .addOrderBy('j.id', 'ASC')
        .getOne();
      if (row === null) return null;
      const startedAt = nowIso();
      Object.assign(row, {
        state: 'running',
        attempts: row.attempts + 1,
        progressPercent: 0,
        startedAt,
      });
      await tx
        .getRepository(QueueJob)
        .update(
          { id: row.id },
          { state: 'running', attempts: row.attempts, progressPercent: 0, startedAt },
        );
      return toQueuedJob<P>(row);
    });
  }

  async progress(jobId: string, percent: number): Promise<void> {
    await this.writes.run((tx) =>
      tx
        .getRepository(QueueJob)
        .update({ id: jobId, state: 'running' }, { progressPercent: Math.round(percent) }),
    );
  }

  async complete(tx: EntityManager, jobId: string): Promise<void> {
    await tx
      .getRepository(QueueJob)
      .update(
        { id: jobId },
        { state: 'done', progressPercent: 100, error: null, finishedAt: nowIso() },
      );
  }

  async fail(tx: EntityManager, jobId: string, error: string): Promise<FailOutcome> {
    const row = await tx.getRepository(QueueJob).findOneByOrFail({ id: jobId });
    const willRetry = row.attempts < row.maxAttempts;
    await tx
      .getRepository(QueueJob)
      .update(
        { id: jobId },
        willRetry
          ? { state: 'queued', error, progressPercent: 0 }
          : { state: 'failed', error, finishedAt: nowIso() },
      );
    return { willRetry, attempts: row.attempts, maxAttempts: row.maxAttempts };
  }

  async release(jobId: string, delayMs: number): Promise<void> {
    await this.writes.run(async (tx) => {
      const row = await tx.getRepository(QueueJob).findOneByOrFail({ id: jobId });
      await tx.getRepository(QueueJob).update(
        { id: jobId, state: 'running' },
        {
          state: 'queued',
          attempts: Math.max(0, row.attempts - 1),
          progressPercent: 0,
          startedAt: null,
          runAfter: new Date(Date.now() + delayMs).toISOString(),
        },
      );
    });
  }

  async recover(options: RecoverOptions = {}): Promise<RecoveredJob[]> {
    const keep = options.stillRunning ?? new Set<string>();
    return this.writes.run(async (tx) => {
      const running = await tx.getRepository(QueueJob).find({ where: { state: 'running' } });
      const stuck = running.filter((row) => !keep.has(row.id));
      const recovered: RecoveredJob[] = [];
      for (const row of stuck) {
        const willRetry = row.attempts < row.maxAttempts;
        const error = `The server stopped during attempt ${row.attempts} of ${row.maxAttempts}.`;
        const changes = willRetry
          ? { state: 'queued' as const, error, progressPercent: 0 }
          : { state: 'failed' as const, error, finishedAt: nowIso() };
        await tx.getRepository(QueueJob).update({ id: row.id }, changes);
        recovered.push({ job: toQueuedJob({ ...row, ...changes }), willRetry });
      }
      if (stuck.length > 0) this.logger.warn(`Recovered ${stuck.length} interrupted job(s)`);
      return recovered;
    });
  }

  async byId<P>(jobId: string, tx?: EntityManager): Promise<QueuedJob<P> | null> {
    const manager = tx ?? this.dataSource.manager;
    const row = await manager.getRepository(QueueJob).findOneBy({ id: jobId });
    return row === null ? null : toQueuedJob<P>(row);
  }

  async running<P>(lane: string): Promise<Array<QueuedJob<P>>> {
    const rows = await this.dataSource.getRepository(QueueJob).find({
      where: { lane, state: 'running' },
      order: { startedAt: 'ASC', id: 'ASC' },
    });
    return rows.map((row) => toQueuedJob<P>(row));
  }

  async latestBySubject(subjectIds: readonly string[]): Promise<Map<string, QueuedJob>> {
    const latest = new Map<string, QueuedJob>();
    if (subjectIds.length === 0) return latest;
    const rows = await this.dataSource.getRepository(QueueJob).find({
      where: { subjectId: In([...subjectIds]) },
      order: { createdAt: 'DESC', id: 'DESC' },
    });
    for (const row of rows)
      if (!latest.has(row.subjectId)) latest.set(row.subjectId, toQueuedJob(row));
    return latest;
  }

  async nextDueInMs(lane: string): Promise<number | null> {
    const row = await this.dataSource
      .getRepository(QueueJob)
      .createQueryBuilder('j')
      .select('MIN(j.runAfter)', 'runAfter')
      .where('j.lane = :lane AND j.state = :state', { lane, state: 'queued' })
      .getRawOne<{ runAfter: string | null }>();
    if (row === undefined || row.runAfter === null) return null;
    return Math.max(0, Date.parse(row.runAfter) - Date.now());
  }

  activeCount(lane?: string): Promise<number> {
    return this.dataSource.getRepository(QueueJob).count({
      where: {
        state: In(['queued', 'running']),
        ...(lane === undefined ? {} : { lane }),
      },
    });
  }
}

function toQueuedJob<P>(row: QueueJob): QueuedJob<P> {
  return {
    id: row.id,
    lane: row.lane,
    subjectId: row.subjectId,
    payload: JSON.parse(row.payloadJson) as P,
    state: row.state,
    attempts: row.attempts,
    maxAttempts: row.maxAttempts,
    progressPercent: row.progressPercent,
    error: row.error,
    createdAt: row.createdAt,
    startedAt: row.startedAt,
    finishedAt: row.finishedAt,
  };
}
