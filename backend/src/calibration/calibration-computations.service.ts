import {
  Inject,
  Injectable,
  Logger,
  OnApplicationBootstrap,
  OnModuleDestroy,
} from '@nestjs/common';
import { OnEvent } from '@nestjs/event-emitter';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, In } from 'typeorm';
import type { CalibrationCheckView } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import { APP_CONFIG } from '../config/config.module';
import type { AppConfig } from '../config/app.config';
import { WorkerPoolService } from '../jobs/worker-pool.service';
import type { AnalyzeOutcome } from '../jobs/worker/worker-tasks';
import { JOB_QUEUE } from '../queue/job-queue';
import type { JobQueue, QueuedJob } from '../queue/job-queue';
import { LanePump } from '../queue/lane-pump';
import type { AnalysisSettings } from '../signal/pipeline/analysis-settings';
import { calibrationFilePaths } from './calibration-files';
import { compareCalibration } from './calibration-comparison';
import { CalibrationRun } from './calibration-run.entity';
import { CALIBRATION_SIGNAL, calibrationTruth, type CalibrationSignal } from './calibration-signal';
import {
  CALIBRATION_LANE,
  CALIBRATION_QUEUED,
  type CalibrationPayload,
} from './calibration.service';
import { threadErrorMessage } from '../common/errors/error-message';

/** Either the checks of a finished computation or why it could not be computed. */
type RunEnd = { checks: CalibrationCheckView[] } | { error: string };

/**
 * Runs the queue's calibration lane, one run at a time: the resting file, then the task file
 * with the resting PAF as its IAF (as a visit's task follows its rest), both on the worker
 * pool's analysis threads with the code path of every recording, then the comparison, the
 * run's row, the job and the audit entry in one transaction. A failed attempt is tried once
 * more; after that the run is stored as failed with the reason.
 */
@Injectable()
export class CalibrationComputationsService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('Calibration');
  private stopping = false;
  private readonly lanePump = new LanePump({
    drain: () => this.drain(),
    stopping: () => this.stopping,
    onError: (error) => this.logger.error(`Calibration pump failed: ${String(error)}`),
  });

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(JOB_QUEUE) private readonly queue: JobQueue,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(CALIBRATION_SIGNAL) private readonly signal: CalibrationSignal,
    private readonly pool: WorkerPoolService,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
  ) {}

  /** After the processing module has recovered the queue (it is imported, so it starts first). */
  async onApplicationBootstrap(): Promise<void> {
    await this.settleAbandoned();
    this.pump();
  }

  async onModuleDestroy(): Promise<void> {
    this.stopping = true;
    await this.lanePump.settled();
  }

  @OnEvent(CALIBRATION_QUEUED)
  pump(): void {
    this.lanePump.run();
  }

  /** One run at a time until the lane is empty. */
  private async drain(): Promise<void> {
    let job = await this.queue.claim<CalibrationPayload>(CALIBRATION_LANE);
    while (job !== null && !this.stopping) {
      await this.execute(job);
      job = this.stopping ? null : await this.queue.claim<CalibrationPayload>(CALIBRATION_LANE);
    }
  }

  private async execute(job: QueuedJob<CalibrationPayload>): Promise<void> {
    const run = await this.dataSource
      .getRepository(CalibrationRun)
      .findOneBy({ id: job.payload.runId });
    if (run === null) {
      await this.writes.run((tx) => this.queue.complete(tx, job.id));
      return;
    }
    await this.writes.run((tx) =>
      tx.getRepository(CalibrationRun).update({ id: run.id }, { state: 'computing' }),
    );
    let end: RunEnd;
    try {
      end = { checks: await this.compute(run) };
    } catch (error) {
      end = { error: threadErrorMessage(error) };
    }
    if (this.stopping) return;
    await this.store(job, run, end);
  }

  /** Both files through the worker pool, then computed vs known. */
  private async compute(run: CalibrationRun): Promise<CalibrationCheckView[]> {
    const settings = JSON.parse(run.settingsJson) as AnalysisSettings;
    const files = calibrationFilePaths(this.config.dataDir, run.id);
    const ignore = (): void => undefined;
    const rest: AnalyzeOutcome = await this.pool.analyze(
      {
        filePath: files.rest,
        checksumSha256: run.restSha256,
        kind: 'resting',
        csvOnsets: null,
        settings,
        iafHz: null,
      },
      ignore,
    );
    const iafHz = rest.summary.rest?.pafHz ?? rest.summary.rest?.cogHz ?? null;
    const task = await this.pool.analyze(
      {
        filePath: files.task,
        checksumSha256: run.taskSha256,
        kind: 'task',
        csvOnsets: null,
        settings,
        iafHz,
      },
      ignore,
    );
    return compareCalibration(calibrationTruth(this.signal, settings), this.signal.tolerances, {
      rest: rest.summary,
      task: task.summary,
    });
  }

  /** The run's outcome, its job and its audit entry, together. */
  private async store(
    job: QueuedJob<CalibrationPayload>,
    run: CalibrationRun,
    end: RunEnd,
  ): Promise<void> {
    await this.writes.run(async (tx) => {
      let error: string | null = null;
      if ('error' in end) {
        const outcome = await this.queue.fail(
          tx,
          job.id,
          `Attempt ${job.attempts} of ${job.maxAttempts} failed: ${end.error}`,
        );
        if (outcome.willRetry) {
          await tx.getRepository(CalibrationRun).update({ id: run.id }, { state: 'queued' });
          return;
        }
        error = `The computation failed: ${end.error}`;
      } else {
        await this.queue.complete(tx, job.id);
      }
      await this.settle(tx, run, 'checks' in end ? end.checks : [], error);
    });
    if ('error' in end) this.logger.warn(`Calibration run ${run.id}: ${end.error}`);
  }

  /** The run passed or failed, with its audit entry (inside the caller's transaction). */
  private async settle(
    tx: EntityManager,
    run: CalibrationRun,
    checks: CalibrationCheckView[],
    error: string | null,
  ): Promise<void> {
    const passed = error === null && checks.length > 0 && checks.every((c) => c.passed);
    await tx.getRepository(CalibrationRun).update(
      { id: run.id },
      {
        state: passed ? 'passed' : 'failed',
        checksJson: JSON.stringify(checks),
        error,
        finishedAt: nowIso(),
      },
    );
    await this.audit.record({
      actor: null,
      action: passed ? 'pass' : 'fail',
      objectType: 'Calibration',
      objectId: run.id,
      studyId: run.studyId,
      siteId: run.siteId,
      after: {
        siteCode: await this.siteCode(tx, run.siteId),
        checks,
        error,
        settingsVersion: run.settingsVersion,
        gyreVersion: run.gyreVersion,
      },
    });
  }

  private async siteCode(tx: EntityManager, siteId: string): Promise<string | null> {
    const rows = (await tx.query(`SELECT "code" FROM "site" WHERE "id" = ?`, [siteId])) as Array<{
      code: string;
    }>;
    return rows[0]?.code ?? null;
  }

  /**
   * Runs whose job ended without them (a stopped server used up the job's attempts): stored
   * as failed, so no run waits forever.
   */
  private async settleAbandoned(): Promise<void> {
    const open = await this.dataSource
      .getRepository(CalibrationRun)
      .findBy({ state: In(['queued', 'computing']) });
    if (open.length === 0) return;
    const jobs = await this.queue.latestBySubject(open.map((run) => run.id));
    for (const run of open) {
      const job = jobs.get(run.id);
      if (job !== undefined && job.state !== 'failed' && job.state !== 'done') continue;
      const reason = `The computation was interrupted: ${job?.error ?? 'its job was lost'}`;
      await this.writes.run((tx) => this.settle(tx, run, [], reason));
    }
  }
}
