import { randomUUID } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { EventEmitter2 } from '@nestjs/event-emitter';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In } from 'typeorm';
import { subject, type CalibrationRunView } from '@gyre/shared';
import { valuesOf } from '../analysis/analysis-settings.service';
import { AnalysisSettingsService } from '../analysis/analysis-settings.service';
import { AuditService } from '../audit/audit.service';
import { applyScope, scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { nowIso } from '../common/time';
import { APP_CONFIG } from '../config/config.module';
import type { AppConfig } from '../config/app.config';
import { JOB_QUEUE } from '../queue/job-queue';
import type { JobQueue } from '../queue/job-queue';
import { SitesService } from '../sites/sites.service';
import { GYRE_VERSION } from '../version';
import { removeCalibrationFiles, writeCalibrationFiles } from './calibration-files';
import { CalibrationRun } from './calibration-run.entity';
import {
  CALIBRATION_SIGNAL,
  calibrationRestFile,
  calibrationTaskFile,
  type CalibrationSignal,
} from './calibration-signal';
import { toCalibrationRunView } from './calibration-view';
import { CalibrationError, calibrationError } from './calibration.errors';

/** The queue lane of calibration runs (the same job table as every computation). */
export const CALIBRATION_LANE = 'calibration';
export const CALIBRATION_QUEUED = 'calibration.queued';

/** The job's payload: only the run's id; everything else is on the run's row. */
export interface CalibrationPayload {
  runId: string;
}

/** The newest runs a site's list shows. */
const SITE_HISTORY = 20;

/**
 * Starts calibration runs and reads them back under the caller's row scope. A run writes its
 * two generated files, its row, its job and its audit entry; the computing is done by
 * CalibrationComputationsService.
 */
@Injectable()
export class CalibrationService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(JOB_QUEUE) private readonly queue: JobQueue,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(CALIBRATION_SIGNAL) private readonly signal: CalibrationSignal,
    private readonly sites: SitesService,
    private readonly settings: AnalysisSettingsService,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly events: EventEmitter2,
  ) {}

  async start(caller: Caller, siteId: string): Promise<CalibrationRunView> {
    // A site the caller cannot read and one they may read but not calibrate look the same.
    const site = await this.sites.findInScope(caller, 'read', siteId).catch((error: unknown) => {
      if (error instanceof GyreException && error.kind === ErrorKind.NotFound) return null;
      throw error;
    });
    if (
      site === null ||
      !caller.ability.can('create', subject('Calibration', { studyId: site.studyId, siteId }))
    ) {
      throw calibrationError(CalibrationError.SiteNotFound, `No site ${siteId}`, {
        field: 'siteId',
        id: siteId,
      });
    }
    const version = await this.settings.currentFor(site.studyId);
    const values = valuesOf(version);
    const run: CalibrationRun = {
      id: randomUUID(),
      studyId: site.studyId,
      siteId,
      state: 'queued',
      signalName: this.signal.name,
      settingsVersionId: version.id,
      settingsVersion: version.version,
      settingsJson: JSON.stringify(values),
      gyreVersion: GYRE_VERSION,
      restSha256: '',
      taskSha256: '',
      checksJson: '[]',
      error: null,
      requestedById: caller.user.id,
      requestedAt: nowIso(),
      finishedAt: null,
    };
    const rest = calibrationRestFile(this.signal);
    const task = calibrationTaskFile(this.signal, values.onsetLabel ?? 'stimulus');
    run.restSha256 = rest.checksumSha256;
    run.taskSha256 = task.checksumSha256;
    writeCalibrationFiles(this.config.dataDir, run.id, { rest, task });
    try {
      await this.writes.run(async (tx) => {
        const active = await tx.getRepository(CalibrationRun).countBy({
          siteId,
          state: In(['queued', 'computing']),
        });
        if (active > 0) {
          throw calibrationError(
            CalibrationError.AlreadyRunning,
            `Site ${site.code} already has a calibration run waiting or computing`,
            { siteId },
          );
        }
        await tx.getRepository(CalibrationRun).insert(run);
        await this.queue.enqueue<CalibrationPayload>(tx, {
          lane: CALIBRATION_LANE,
          subjectId: run.id,
          payload: { runId: run.id },
          maxAttempts: 2,
        });
        await this.audit.recordBy(caller, run, {
          action: 'start',
          objectType: 'Calibration',
          objectId: run.id,
          after: {
            siteCode: site.code,
            signalName: run.signalName,
            settingsVersion: run.settingsVersion,
            gyreVersion: run.gyreVersion,
          },
        });
      });
    } catch (error) {
      removeCalibrationFiles(this.config.dataDir, run.id);
      throw error;
    }
    this.events.emit(CALIBRATION_QUEUED);
    return (await this.views([run]))[0];
  }

  /** A site's runs, newest first (the last 20). */
  async forSite(caller: Caller, siteId: string): Promise<CalibrationRunView[]> {
    const site = await this.sites.findInScope(caller, 'read', siteId);
    const runs = await this.dataSource.getRepository(CalibrationRun).find({
      where: scopedWhere<CalibrationRun>(caller.ability, 'read', 'Calibration', {
        siteId: site.id,
      }),
      order: { requestedAt: 'DESC', id: 'ASC' },
      take: SITE_HISTORY,
    });
    return this.views(runs);
  }

  /** The newest run of every site the caller may read (optionally of one study). */
  async latestPerSite(caller: Caller, studyId?: string): Promise<CalibrationRunView[]> {
    const query = this.dataSource
      .getRepository(CalibrationRun)
      .createQueryBuilder('c')
      .where(
        `c.requestedAt = (SELECT MAX(n."requestedAt") FROM "calibration_run" n
          WHERE n."siteId" = c.siteId)`,
      );
    if (studyId !== undefined) query.andWhere('c.studyId = :studyId', { studyId });
    const runs = await applyScope(query, 'c', caller.ability, 'read', 'Calibration')
      .orderBy('c.siteId', 'ASC')
      .getMany();
    return this.views(runs);
  }

  /** Views with each run's site code and requester's name (two reads for any number of runs). */
  private async views(runs: CalibrationRun[]): Promise<CalibrationRunView[]> {
    if (runs.length === 0) return [];
    const siteIds = [...new Set(runs.map((run) => run.siteId))];
    const userIds = [...new Set(runs.map((run) => run.requestedById))];
    const sites = (await this.dataSource.query(
      `SELECT "id", "code" FROM "site" WHERE "id" IN (SELECT value FROM json_each(?))`,
      [JSON.stringify(siteIds)],
    )) as Array<{ id: string; code: string }>;
    const users = (await this.dataSource.query(
      `SELECT "id", "name" FROM "user" WHERE "id" IN (SELECT value FROM json_each(?))`,
      [JSON.stringify(userIds)],
    )) as Array<{ id: string; name: string }>;
    const codes = new Map(sites.map((s) => [s.id, s.code]));
    const names = new Map(users.map((u) => [u.id, u.name]));
    return runs.map((run) =>
      toCalibrationRunView(run, codes.get(run.siteId) ?? '', names.get(run.requestedById) ?? null),
    );
  }
}
