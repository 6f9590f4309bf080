import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager } from 'typeorm';
import { subject } from '@gyre/shared';
import type { AnalysisSettingsDto, AnalysisSettingsValues, Page } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { PageQueryDto, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import { Study } from '../studies/study.entity';
import { AnalysisError } from './analysis.errors';
import { DEFAULT_ANALYSIS_SETTINGS } from './analysis-settings.defaults';
import { AnalysisSettings } from './analysis-settings.entity';
import { settingsProblems } from './analysis-settings.rules';
import { AnalysisSettingsChangeDto } from './dto/analysis-settings-change.dto';

/** Versioned analysis settings per study: version 1 is Gyre's defaults, each change adds one. */
@Injectable()
export class AnalysisSettingsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactions,
    private readonly audit: AuditService,
  ) {}

  async current(caller: Caller, studyId: string): Promise<AnalysisSettingsDto> {
    await this.studyInScope(caller, studyId, 'read');
    return toSettingsDto(await this.currentFor(studyId));
  }

  async versions(
    caller: Caller,
    studyId: string,
    query: PageQueryDto,
  ): Promise<Page<AnalysisSettingsDto>> {
    await this.studyInScope(caller, studyId, 'read');
    await this.currentFor(studyId);
    const window = pageWindowOf(query, 'desc');
    const found = await this.dataSource.getRepository(AnalysisSettings).findAndCount({
      where: scopedWhere<AnalysisSettings>(caller.ability, 'read', 'AnalysisSettings', { studyId }),
      order: { version: window.order },
      skip: window.skip,
      take: window.take,
    });
    return toPage(found, window, toSettingsDto);
  }

  /** Adds a new version (audited); runs already made keep the version they were made with. */
  async change(
    caller: Caller,
    studyId: string,
    change: AnalysisSettingsChangeDto,
  ): Promise<AnalysisSettingsDto> {
    await this.studyInScope(caller, studyId, 'create');
    const { reason, ...values } = change;
    const problems = settingsProblems(values);
    if (problems.length > 0) {
      throw new GyreException(
        ErrorKind.BadInput,
        AnalysisError.SettingsInvalid,
        problems.join('; '),
        {
          problems,
        },
      );
    }
    return this.writes.run(async (manager) => {
      const previous = await this.ensureCurrent(manager, studyId);
      const row = toRow(values, {
        id: randomUUID(),
        studyId,
        version: previous.version + 1,
        reason: reason.trim(),
        createdById: caller.user.id,
        createdAt: nowIso(),
      });
      await manager.getRepository(AnalysisSettings).insert(row);
      await this.audit.record({
        actor: caller.user,
        action: 'update',
        objectType: 'AnalysisSettings',
        objectId: row.id,
        studyId,
        siteId: null,
        before: { version: previous.version, ...valuesOf(previous) },
        after: { version: row.version, ...values },
        reason: row.reason,
        clientIp: caller.clientIp,
      });
      return toSettingsDto(row);
    });
  }

  /** The study's newest version, writing version 1 (the defaults) when there is none. */
  async currentFor(studyId: string): Promise<AnalysisSettings> {
    const found = await this.latest(this.dataSource.manager, studyId);
    if (found !== null) return found;
    return this.writes.run((manager) => this.ensureCurrent(manager, studyId));
  }

  async byId(
    id: string,
    manager: EntityManager = this.dataSource.manager,
  ): Promise<AnalysisSettings> {
    return manager.getRepository(AnalysisSettings).findOneByOrFail({ id });
  }

  /** Inside a write transaction: the newest version, or a new version 1. */
  async ensureCurrent(manager: EntityManager, studyId: string): Promise<AnalysisSettings> {
    const found = await this.latest(manager, studyId);
    if (found !== null) return found;
    const row = toRow(DEFAULT_ANALYSIS_SETTINGS, {
      id: randomUUID(),
      studyId,
      version: 1,
      reason: 'Gyre defaults (METHOD.md)',
      createdById: null,
      createdAt: nowIso(),
    });
    await manager.getRepository(AnalysisSettings).insert(row);
    return row;
  }

  private latest(manager: EntityManager, studyId: string): Promise<AnalysisSettings | null> {
    return manager
      .getRepository(AnalysisSettings)
      .findOne({ where: { studyId }, order: { version: 'DESC' } });
  }

  /** 404 for a study that does not exist or lies outside the caller's scope. */
  private async studyInScope(
    caller: Caller,
    studyId: string,
    action: 'read' | 'create',
  ): Promise<void> {
    const study = await this.dataSource.getRepository(Study).findOne({
      where: scopedWhere<Study>(caller.ability, 'read', 'Study', { id: studyId }),
    });
    if (study === null || !caller.ability.can(action, subject('AnalysisSettings', { studyId }))) {
      throw new GyreException(
        ErrorKind.NotFound,
        AnalysisError.StudyNotFound,
        `No study ${studyId}.`,
        {
          studyId,
        },
      );
    }
  }
}

type RowMeta = Pick<
  AnalysisSettings,
  'id' | 'studyId' | 'version' | 'reason' | 'createdById' | 'createdAt'
>;

function toRow(values: AnalysisSettingsValues, meta: RowMeta): AnalysisSettings {
  const row = new AnalysisSettings();
  Object.assign(row, meta, {
    bandLowHz: values.bandHz?.[0] ?? null,
    bandHighHz: values.bandHz?.[1] ?? null,
    method: values.method,
    morletCycles: values.morletCycles,
    epochStartS: values.epochWindowS[0],
    epochEndS: values.epochWindowS[1],
    baselineStartS: values.baselineWindowS[0],
    baselineEndS: values.baselineWindowS[1],
    postStartS: values.postWindowS[0],
    postEndS: values.postWindowS[1],
    rejectionThresholdUv: values.rejectionThresholdUv,
    flagThresholdHz: values.flagThresholdHz,
    roiJson: JSON.stringify(values.roi),
    onsetLabel: values.onsetLabel ?? null,
  });
  return row;
}

export function valuesOf(row: AnalysisSettings): AnalysisSettingsValues {
  return {
    bandHz:
      row.bandLowHz === null || row.bandHighHz === null ? null : [row.bandLowHz, row.bandHighHz],
    method: row.method,
    morletCycles: row.morletCycles,
    epochWindowS: [row.epochStartS, row.epochEndS],
    baselineWindowS: [row.baselineStartS, row.baselineEndS],
    postWindowS: [row.postStartS, row.postEndS],
    rejectionThresholdUv: row.rejectionThresholdUv,
    flagThresholdHz: row.flagThresholdHz,
    roi: JSON.parse(row.roiJson) as string[],
    onsetLabel: row.onsetLabel,
  };
}

export function toSettingsDto(row: AnalysisSettings): AnalysisSettingsDto {
  return {
    id: row.id,
    studyId: row.studyId,
    version: row.version,
    ...valuesOf(row),
    reason: row.reason,
    createdById: row.createdById,
    createdAt: row.createdAt,
  };
}
