import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager } from 'typeorm';
import { subject } from '@gyre/shared';
import type { AnalysisSettingsView, Page } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { PageQueryDto, pageWindowOf } from '../common/pagination/page-query.dto';
import { nowIso } from '../common/time';
import {
  AnalysisSettings as SettingsValues,
  DEFAULT_ANALYSIS_SETTINGS,
} from '../signal/pipeline/analysis-settings';
import { StudiesService } from '../studies/studies.service';
import { AnalysisError, analysisError } from './analysis.errors';
import { AnalysisSettings } from './analysis-settings.entity';
import { settingsProblems } from './analysis-settings.rules';
import { AnalysisSettingsChangeDto } from './dto/analysis-settings-change.dto';
import { settingsFieldChanges } from './settings-differences';
import { parseStoredSettings, settingsJson } from './settings-values';

/**
 * Versioned analysis settings per study: version 1 is Gyre's defaults, each change adds one.
 * A new version computes nothing by itself: runs keep the settings they were made with, and
 * Review says where the current version would give different numbers.
 */
@Injectable()
export class AnalysisSettingsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly studies: StudiesService,
  ) {}

  async current(caller: Caller, studyId: string): Promise<AnalysisSettingsView> {
    await this.studyInScope(caller, studyId, 'read');
    const current = await this.currentFor(studyId);
    const previous = await this.byVersion(studyId, current.version - 1);
    return toSettingsView(current, previous);
  }

  async versions(
    caller: Caller,
    studyId: string,
    query: PageQueryDto,
  ): Promise<Page<AnalysisSettingsView>> {
    await this.studyInScope(caller, studyId, 'read');
    await this.currentFor(studyId);
    const window = pageWindowOf(query, 'desc');
    const [rows, total] = await this.dataSource.getRepository(AnalysisSettings).findAndCount({
      where: { studyId },
      order: { version: window.order },
      skip: window.skip,
      take: window.take,
    });
    const items: AnalysisSettingsView[] = [];
    for (const row of rows) {
      items.push(toSettingsView(row, await this.byVersion(studyId, row.version - 1)));
    }
    return { items, total, page: window.page, pageSize: window.pageSize };
  }

  /** Adds a new version (audited); refused when it would change nothing. */
  async change(
    caller: Caller,
    studyId: string,
    change: AnalysisSettingsChangeDto,
  ): Promise<AnalysisSettingsView> {
    await this.studyInScope(caller, studyId, 'create');
    const { reason, ...values } = change;
    const problems = settingsProblems(values);
    if (problems.length > 0) {
      throw analysisError(AnalysisError.SettingsInvalid, problems.join('; '), {
        problems,
      });
    }
    return this.writes.run(async (manager) => {
      const previous = await this.ensureCurrent(manager, studyId);
      const changes = settingsFieldChanges(valuesOf(previous), values);
      if (changes.length === 0) {
        throw analysisError(
          AnalysisError.SettingsUnchanged,
          `Nothing changed: these are the values of version ${previous.version}.`,
          { version: previous.version },
        );
      }
      const row = Object.assign(new AnalysisSettings(), {
        id: randomUUID(),
        studyId,
        version: previous.version + 1,
        valuesJson: settingsJson(values),
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
        before: { version: previous.version, ...pick(valuesOf(previous), changes) },
        after: { version: row.version, ...pick(values, changes) },
        reason: row.reason,
        clientIp: caller.clientIp,
      });
      return toSettingsView(row, previous);
    });
  }

  /** The study's newest version, writing version 1 (the defaults) when there is none. */
  async currentFor(studyId: string): Promise<AnalysisSettings> {
    const found = await this.latest(this.dataSource.manager, studyId);
    if (found !== null) return found;
    return this.writes.run((manager) => this.ensureCurrent(manager, studyId));
  }

  /** Inside a write transaction: the newest version, or a new version 1. */
  async ensureCurrent(manager: EntityManager, studyId: string): Promise<AnalysisSettings> {
    const found = await this.latest(manager, studyId);
    if (found !== null) return found;
    const row = Object.assign(new AnalysisSettings(), {
      id: randomUUID(),
      studyId,
      version: 1,
      valuesJson: settingsJson(DEFAULT_ANALYSIS_SETTINGS),
      reason: "Gyre's defaults",
      createdById: null,
      createdAt: nowIso(),
    });
    await manager.getRepository(AnalysisSettings).insert(row);
    return row;
  }

  private byVersion(studyId: string, version: number): Promise<AnalysisSettings | null> {
    if (version < 1) return Promise.resolve(null);
    return this.dataSource.getRepository(AnalysisSettings).findOneBy({ studyId, version });
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
    const visible = await this.studies.findInScope(caller, 'read', studyId).then(
      () => true,
      () => false,
    );
    if (!visible || !caller.ability.can(action, subject('AnalysisSettings', { studyId }))) {
      throw analysisError(AnalysisError.StudyNotFound, `No study ${studyId}.`, {
        studyId,
      });
    }
  }
}

export function valuesOf(row: AnalysisSettings): SettingsValues {
  return parseStoredSettings(row.valuesJson);
}

function pick(
  values: SettingsValues,
  changes: { field: keyof SettingsValues }[],
): Partial<SettingsValues> {
  return Object.fromEntries(changes.map((c) => [c.field, values[c.field]]));
}

export function toSettingsView(
  row: AnalysisSettings,
  previous: AnalysisSettings | null,
): AnalysisSettingsView {
  const values = valuesOf(row);
  return {
    id: row.id,
    studyId: row.studyId,
    version: row.version,
    ...values,
    changes: previous === null ? [] : settingsFieldChanges(valuesOf(previous), values),
    reason: row.reason,
    createdById: row.createdById,
    createdAt: row.createdAt,
  };
}
