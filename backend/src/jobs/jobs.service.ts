import { randomUUID } from 'node:crypto';
import { join } from 'node:path';
import {
  Inject,
  Injectable,
  Logger,
  OnApplicationBootstrap,
  OnModuleDestroy,
} from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, In } from 'typeorm';
import { AnalysisRun } from '../analysis/analysis-run.entity';
import { AnalysisRunsService } from '../analysis/analysis-runs.service';
import {
  BOOTSTRAP_RESAMPLES,
  BOOTSTRAP_SEED,
  DEFAULT_ALPHA_BAND_HZ,
  IAF_HALF_WIDTH_HZ,
} from '../analysis/analysis-settings.defaults';
import { AnalysisSettings } from '../analysis/analysis-settings.entity';
import { AnalysisSettingsService, valuesOf } from '../analysis/analysis-settings.service';
import { AuditService } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { nowIso } from '../common/time';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { Recording } from '../recordings/recording.entity';
import { ReportsService } from '../reports/reports.service';
import { Job } from './job.entity';
import { JobsError } from './jobs.errors';
import { RecordingEventsService } from './recording-events.service';
import { WorkerPoolService } from './worker-pool.service';
import type { ResolvedAnalysisOptions } from './worker/worker-tasks';
import type { BandSource } from '@gyre/shared';

const MAX_ATTEMPTS = 3;
/** Progress is written at most this often per job (the SSE stream gets every change). */
const PROGRESS_WRITE_INTERVAL_MS = 500;

/**
 * The queue is the `job` table; this service claims queued jobs one per free worker
 * thread, runs them in the pool and writes the outcome. A job left `running` by a stopped
 * server goes back to `queued` at the next start; each start of a job counts as an
 * attempt, and after three the job and its recording are `failed` with the last error.
 * Jobs are independent: one failing never touches another.
 */
@Injectable()
export class JobsService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('Jobs');
  private running = 0;
  private stopping = false;
  private pumping: Promise<void> | null = null;
  private pumpAgain = false;
  private readonly inFlight = new Set<Promise<void>>();

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly writes: WriteTransactions,
    private readonly pool: WorkerPoolService,
    private readonly events: RecordingEventsService,
    private readonly settings: AnalysisSettingsService,
    private readonly runs: AnalysisRunsService,
    private readonly reports: ReportsService,
    private readonly audit: AuditService,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    await this.recover();
    this.pump();
  }

  async onModuleDestroy(): Promise<void> {
    this.stopping = true;
    // Jobs still running stay `running` in the table and are picked up at the next start.
    await Promise.race([Promise.allSettled([...this.inFlight]), delay(2000)]);
  }

  /** Puts jobs a stopped server left running back in the queue (or fails them after 3 attempts). */
  async recover(): Promise<void> {
    await this.writes.run(async (manager) => {
      const stuck = await manager.getRepository(Job).find({ where: { state: 'running' } });
      for (const job of stuck) {
        const exhausted = job.attempts >= job.maxAttempts;
        const error = `The server stopped during attempt ${job.attempts} of ${job.maxAttempts}.`;
        await manager
          .getRepository(Job)
          .update(
            { id: job.id },
            exhausted
              ? { state: 'failed', error, finishedAt: nowIso() }
              : { state: 'queued', error, progressPercent: 0 },
          );
        await manager
          .getRepository(Recording)
          .update(
            { id: job.recordingId },
            exhausted
              ? { state: 'failed', failureMessage: error, updatedAt: nowIso() }
              : { state: 'queued', updatedAt: nowIso() },
          );
      }
      if (stuck.length > 0) this.logger.warn(`Re-queued ${stuck.length} interrupted job(s)`);
    });
  }

  /** Inside a write transaction: queues a computation of `recording` with the current settings. */
  async enqueue(manager: EntityManager, recording: Recording, requestedById: string): Promise<Job> {
    const settings = await this.settings.ensureCurrent(manager, recording.studyId);
    const job = Object.assign(new Job(), {
      id: randomUUID(),
      recordingId: recording.id,
      settingsId: settings.id,
      state: 'queued' as const,
      attempts: 0,
      maxAttempts: MAX_ATTEMPTS,
      progressPercent: 0,
      error: null,
      requestedById,
      createdAt: nowIso(),
      startedAt: null,
      finishedAt: null,
    });
    await manager.getRepository(Job).insert(job);
    const changes = { state: 'queued' as const, failureMessage: null, updatedAt: nowIso() };
    await manager.getRepository(Recording).update({ id: recording.id }, changes);
    Object.assign(recording, changes);
    return job;
  }

  /**
   * Re-runs (analyst) or retries (after `failed`) a set of recordings with the current
   * settings: one audited job each. Recordings already queued or computing are refused.
   */
  async requeue(
    caller: Caller,
    recordings: Recording[],
    action: 'rerun' | 'retry',
    reason: string | null,
  ): Promise<Job[]> {
    const jobs = await this.writes.run(async (manager) => {
      const ids = recordings.map((r) => r.id);
      const fresh = await manager.getRepository(Recording).find({ where: { id: In(ids) } });
      const out: Job[] = [];
      for (const recording of fresh) {
        if (
          recording.state === 'rejected' ||
          recording.state === 'received' ||
          recording.storedFile === null
        ) {
          throw new GyreException(
            ErrorKind.Conflict,
            JobsError.NotComputable,
            `Recording ${recording.id} is ${recording.state}: there is no accepted file to compute.`,
            { recordingId: recording.id, state: recording.state },
          );
        }
        if (recording.state === 'queued' || recording.state === 'computing') {
          throw new GyreException(
            ErrorKind.Conflict,
            JobsError.AlreadyQueued,
            `Recording ${recording.id} is already ${recording.state}.`,
            { recordingId: recording.id, state: recording.state },
          );
        }
        const before = { state: recording.state };
        const job = await this.enqueue(manager, recording, caller.user.id);
        const settings = await manager
          .getRepository(AnalysisSettings)
          .findOneByOrFail({ id: job.settingsId });
        await this.audit.record({
          actor: caller.user,
          action,
          objectType: 'Recording',
          objectId: recording.id,
          studyId: recording.studyId,
          siteId: recording.siteId,
          before,
          after: { state: 'queued', jobId: job.id, settingsVersion: settings.version },
          reason,
          clientIp: caller.clientIp,
        });
        out.push(job);
      }
      return out;
    });
    for (const job of jobs) {
      this.events.emit({
        recordingId: job.recordingId,
        state: 'queued',
        progressPercent: 0,
        error: null,
      });
    }
    this.pump();
    return jobs;
  }

  /** Starts queued jobs while worker threads are free. Safe to call at any time. */
  pump(): void {
    if (this.stopping) return;
    if (this.pumping !== null) {
      this.pumpAgain = true;
      return;
    }
    this.pumping = (async () => {
      do {
        this.pumpAgain = false;
        while (!this.stopping && this.running < this.pool.threads) {
          const claimed = await this.claim();
          if (claimed === null) break;
          this.running += 1;
          const done = this.execute(claimed.job, claimed.recording).finally(() => {
            this.running -= 1;
            this.inFlight.delete(done);
            this.pump();
          });
          this.inFlight.add(done);
        }
      } while (this.pumpAgain && !this.stopping);
    })()
      .catch((error: unknown) => this.logger.error(`Queue pump failed: ${String(error)}`))
      .finally(() => {
        this.pumping = null;
      });
  }

  /** Resolves once no job is queued or running (for tests and orderly shutdowns). */
  async idle(timeoutMs = 120_000): Promise<void> {
    const until = Date.now() + timeoutMs;
    while (Date.now() < until) {
      const active = await this.dataSource
        .getRepository(Job)
        .count({ where: { state: In(['queued', 'running']) } });
      if (active === 0 && this.running === 0) return;
      await delay(100);
    }
    throw new Error(`Jobs still active after ${timeoutMs} ms`);
  }

  /**
   * Takes the oldest queued job. A task recording waits while a resting recording of the
   * same visit is still queued or computing, so that its band can follow the visit's IAF.
   */
  private claim(): Promise<{ job: Job; recording: Recording } | null> {
    return this.writes.run(async (manager) => {
      const rows: Array<{ id: string }> = await manager.query(
        `SELECT j."id" FROM "job" j JOIN "recording" r ON r."id" = j."recordingId"
          WHERE j."state" = 'queued'
            AND NOT (r."kind" = 'task' AND EXISTS (
              SELECT 1 FROM "job" j2 JOIN "recording" r2 ON r2."id" = j2."recordingId"
               WHERE r2."visitId" = r."visitId" AND r2."kind" = 'resting'
                 AND j2."state" IN ('queued', 'running')))
          ORDER BY j."createdAt", j."id" LIMIT 1`,
      );
      if (rows.length === 0) return null;
      const job = await manager.getRepository(Job).findOneByOrFail({ id: rows[0].id });
      const startedAt = nowIso();
      Object.assign(job, {
        state: 'running',
        attempts: job.attempts + 1,
        progressPercent: 0,
        startedAt,
      });
      await manager
        .getRepository(Job)
        .update(
          { id: job.id },
          { state: 'running', attempts: job.attempts, progressPercent: 0, startedAt },
        );
      await manager
        .getRepository(Recording)
        .update({ id: job.recordingId }, { state: 'computing', updatedAt: startedAt });
      const recording = await manager
        .getRepository(Recording)
        .findOneByOrFail({ id: job.recordingId });
      return { job, recording };
    });
  }

  private async execute(job: Job, recording: Recording): Promise<void> {
    this.events.emit({
      recordingId: recording.id,
      state: 'computing',
      progressPercent: 0,
      error: null,
    });
    const progress = this.progressWriter(job);
    try {
      const settings = await this.settings.byId(job.settingsId);
      const { options, bandSource } = await this.resolveOptions(recording, settings);
      const outcome = await this.pool.analyze(
        {
          filePath: join(this.config.uploadsDir, recording.storedFile ?? ''),
          checksumSha256: recording.checksumSha256,
          kind: recording.kind,
          csvOnsets:
            recording.csvOnsetsJson === null
              ? null
              : (JSON.parse(recording.csvOnsetsJson) as Array<{ onsetS: number; label: string }>),
          options,
        },
        progress.report,
      );
      await progress.stop();
      if (this.stopping) return;
      await this.writes.run(async (manager) => {
        await this.runs.store(manager, { job, recording, settings, options, bandSource, outcome });
        const finishedAt = nowIso();
        await manager
          .getRepository(Job)
          .update({ id: job.id }, { state: 'done', progressPercent: 100, error: null, finishedAt });
        await manager
          .getRepository(Recording)
          .update(
            { id: recording.id },
            { state: 'ready', failureMessage: null, updatedAt: finishedAt },
          );
        await this.reports.ensureDraft(manager, recording);
      });
      this.events.emit({
        recordingId: recording.id,
        state: 'ready',
        progressPercent: 100,
        error: null,
      });
    } catch (error) {
      await progress.stop();
      if (this.stopping) return;
      // Errors cross the thread boundary as text; drop the class name piscina puts in front.
      const message = (error instanceof Error ? error.message : String(error)).replace(
        /^Error: /,
        '',
      );
      await this.fail(job, recording, message);
    }
  }

  private async fail(job: Job, recording: Recording, message: string): Promise<void> {
    const exhausted = job.attempts >= job.maxAttempts;
    const error = `Attempt ${job.attempts} of ${job.maxAttempts} failed: ${message}`;
    this.logger.warn(`Job ${job.id} (recording ${recording.id}): ${error}`);
    await this.writes.run(async (manager) => {
      const now = nowIso();
      await manager
        .getRepository(Job)
        .update(
          { id: job.id },
          exhausted ? { state: 'failed', error, finishedAt: now } : { state: 'queued', error },
        );
      await manager
        .getRepository(Recording)
        .update(
          { id: recording.id },
          { state: exhausted ? 'failed' : 'queued', failureMessage: error, updatedAt: now },
        );
    });
    this.events.emit({
      recordingId: recording.id,
      state: exhausted ? 'failed' : 'queued',
      progressPercent: null,
      error,
    });
  }

  /**
   * Settings in the signal core's terms. Without a band in the settings, a task recording
   * uses the visit's resting IAF ± 2 Hz (PAF, or CoG when there is no clear peak) when a
   * resting result exists, else 8–13 Hz (METHOD.md §2).
   */
  async resolveOptions(
    recording: Recording,
    settings: AnalysisSettings,
  ): Promise<{ options: ResolvedAnalysisOptions; bandSource: BandSource }> {
    const values = valuesOf(settings);
    let bandHz: [number, number] = [...DEFAULT_ALPHA_BAND_HZ];
    let bandSource: BandSource = 'default';
    if (values.bandHz !== null) {
      bandHz = values.bandHz;
      bandSource = 'settings';
    } else if (recording.kind === 'task') {
      const rest = await this.dataSource.getRepository(AnalysisRun).findOne({
        where: { visitId: recording.visitId, kind: 'resting' },
        order: { createdAt: 'DESC', id: 'DESC' },
      });
      const iafHz = rest?.pafHz ?? rest?.cogHz ?? null;
      if (iafHz !== null) {
        bandHz = [iafHz - IAF_HALF_WIDTH_HZ, iafHz + IAF_HALF_WIDTH_HZ];
        bandSource = 'iaf';
      }
    }
    return {
      bandSource,
      options: {
        bandHz,
        method: values.method,
        morletCycles: values.morletCycles,
        epochWindowS: values.epochWindowS,
        baselineWindowS: values.baselineWindowS,
        postWindowS: values.postWindowS,
        rejectionThresholdUv: values.rejectionThresholdUv,
        flagThresholdHz: values.flagThresholdHz,
        roi: values.roi,
        onsetLabel: values.onsetLabel,
        bootstrapResamples: BOOTSTRAP_RESAMPLES,
        bootstrapSeed: BOOTSTRAP_SEED,
      },
    };
  }

  /** Writes progress at most every 500 ms and whenever it passes a whole percent. */
  private progressWriter(job: Job): {
    report: (percent: number) => void;
    stop: () => Promise<void>;
  } {
    let last = 0;
    let lastWrittenAt = 0;
    let stopped = false;
    let chain: Promise<unknown> = Promise.resolve();
    return {
      report: (value: number) => {
        const percent = Math.max(0, Math.min(99, Math.floor(value)));
        if (stopped || percent <= last) return;
        last = percent;
        this.events.emit({
          recordingId: job.recordingId,
          state: 'computing',
          progressPercent: percent,
          error: null,
        });
        const now = Date.now();
        if (now - lastWrittenAt < PROGRESS_WRITE_INTERVAL_MS) return;
        lastWrittenAt = now;
        chain = chain.then(() =>
          this.writes
            .run((manager) =>
              manager
                .getRepository(Job)
                .update({ id: job.id, state: 'running' }, { progressPercent: percent }),
            )
            .catch(() => undefined),
        );
      },
      stop: async () => {
        stopped = true;
        await chain;
      },
    };
  }
}

function delay(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms).unref());
}
