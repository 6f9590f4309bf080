import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { EventEmitter2 } from '@nestjs/event-emitter';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { subject } from '@gyre/shared';
import type { VisitAnalysisOverrideView, VisitAnalysisOverrideValues } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { blindedOverrideView } from '../blinding/blinded-views';
import { BlindingService } from '../blinding/blinding.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import { VisitsService } from '../visits/visits.service';
import { AnalysisError, analysisError } from './analysis.errors';
import { settingsProblems } from './analysis-settings.rules';
import { AnalysisSettingsService, valuesOf } from './analysis-settings.service';
import { AnalysisSettings } from './analysis-settings.entity';
import { VisitAnalysisOverrideChangeDto } from './dto/visit-analysis-override-change.dto';
import { AnalysisEvents, VisitOverrideChanged } from './analysis.events';
import { sameValue } from './settings-differences';
import { withOverride } from './settings-values';
import { VisitAnalysisOverride } from './visit-analysis-override.entity';
import type { AnalysisSettings as SettingsValues } from '../signal/pipeline/analysis-settings';

/** The settings one computation of a visit uses: the study's version and the visit's override. */
export interface EffectiveSettings {
  version: AnalysisSettings;
  settings: SettingsValues;
  overrideRevision: number | null;
}

/**
 * A visit's own analysis choices over the study's settings, for the visit that needs them (a
 * saturated channel, another onset label). Each change is a new audited revision; a change
 * announces itself so the visit's recordings are computed again.
 */
@Injectable()
export class VisitAnalysisOverridesService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly settings: AnalysisSettingsService,
    private readonly visits: VisitsService,
    private readonly events: EventEmitter2,
    private readonly blinding: BlindingService,
  ) {}

  async get(caller: Caller, visitId: string): Promise<VisitAnalysisOverrideView> {
    const visit = await this.visits.findInScope(caller, 'read', visitId);
    this.assertMay(caller, 'read', visit.studyId, visitId);
    return this.shown(caller, visitId, await this.latest(visitId));
  }

  async change(
    caller: Caller,
    visitId: string,
    change: VisitAnalysisOverrideChangeDto,
  ): Promise<VisitAnalysisOverrideView> {
    const visit = await this.visits.findInScope(caller, 'read', visitId);
    this.assertMay(caller, 'update', visit.studyId, visitId);
    const { reason, ...values } = change;
    const study = valuesOf(await this.settings.currentFor(visit.studyId));
    const problems = settingsProblems(withOverride(study, values));
    if (problems.length > 0) {
      throw analysisError(AnalysisError.OverrideInvalid, problems.join('; '), {
        problems,
      });
    }
    const row = await this.writes.run(async (tx) => {
      const previous = await this.latest(visitId, tx.getRepository(VisitAnalysisOverride));
      const before = previous === null ? NO_OVERRIDE : valuesOfOverride(previous);
      if (sameValue(before, normalised(values))) {
        throw analysisError(
          AnalysisError.OverrideUnchanged,
          'Nothing changed: the visit already uses these choices.',
          { visitId, revision: previous?.revision ?? 0 },
        );
      }
      const next = Object.assign(new VisitAnalysisOverride(), {
        id: randomUUID(),
        visitId,
        studyId: visit.studyId,
        siteId: visit.siteId,
        revision: (previous?.revision ?? 0) + 1,
        valuesJson: JSON.stringify(normalised(values)),
        reason: reason.trim(),
        createdById: caller.user.id,
        createdAt: nowIso(),
      });
      await tx.getRepository(VisitAnalysisOverride).insert(next);
      await this.audit.recordBy(caller, visit, {
        action: 'update',
        objectType: 'VisitAnalysisOverride',
        objectId: visitId,
        before: { revision: previous?.revision ?? 0, ...before },
        after: { revision: next.revision, ...normalised(values) },
        reason: next.reason,
      });
      return next;
    });
    const event: VisitOverrideChanged = {
      visitId,
      revision: row.revision,
      actor: { id: caller.user.id, email: caller.user.email },
      reason: row.reason,
    };
    await this.events.emitAsync(AnalysisEvents.VisitOverrideChanged, event);
    return this.shown(caller, visitId, row);
  }

  /** The override as the caller may see it: by the visit's blinded clock under blinded review. */
  private async shown(
    caller: Caller,
    visitId: string,
    row: VisitAnalysisOverride | null,
  ): Promise<VisitAnalysisOverrideView> {
    const clock = await this.blinding.clockOf(caller, visitId);
    const view = toOverrideView(visitId, row);
    return clock === null ? view : blindedOverrideView(view, clock);
  }

  /** The settings a computation of this visit uses now. */
  async effectiveFor(studyId: string, visitId: string): Promise<EffectiveSettings> {
    const version = await this.settings.currentFor(studyId);
    const override = await this.latest(visitId);
    return {
      version,
      settings: withOverride(
        valuesOf(version),
        override === null ? null : valuesOfOverride(override),
      ),
      overrideRevision: override?.revision ?? null,
    };
  }

  private latest(
    visitId: string,
    repository = this.dataSource.getRepository(VisitAnalysisOverride),
  ): Promise<VisitAnalysisOverride | null> {
    return repository.findOne({ where: { visitId }, order: { revision: 'DESC' } });
  }

  private assertMay(
    caller: Caller,
    action: 'read' | 'update',
    studyId: string,
    visitId: string,
  ): void {
    if (!caller.ability.can(action, subject('AnalysisSettings', { studyId }))) {
      throw analysisError(AnalysisError.StudyNotFound, `No visit ${visitId}.`, {
        visitId,
      });
    }
  }
}

const NO_OVERRIDE: VisitAnalysisOverrideValues = { roi: null, bandHz: null, onsetLabel: null };

function normalised(values: VisitAnalysisOverrideValues): VisitAnalysisOverrideValues {
  const label = values.onsetLabel?.trim() ?? null;
  return {
    roi: values.roi === null ? null : [...values.roi],
    bandHz: values.bandHz === null ? null : [values.bandHz[0], values.bandHz[1]],
    onsetLabel: label === '' ? null : label,
  };
}

function valuesOfOverride(row: VisitAnalysisOverride): VisitAnalysisOverrideValues {
  return valuesOfOverrideJson(row.valuesJson);
}

/** An override row's stored values, as `effectiveFor` lays them over the study's settings. */
export function valuesOfOverrideJson(valuesJson: string): VisitAnalysisOverrideValues {
  return normalised(JSON.parse(valuesJson) as VisitAnalysisOverrideValues);
}

function toOverrideView(
  visitId: string,
  row: VisitAnalysisOverride | null,
): VisitAnalysisOverrideView {
  if (row === null) {
    return {
      visitId,
      ...NO_OVERRIDE,
      revision: 0,
      reason: null,
      updatedById: null,
      updatedAt: null,
    };
  }
  return {
    visitId,
    ...valuesOfOverride(row),
    revision: row.revision,
    reason: row.reason,
    updatedById: row.createdById,
    updatedAt: row.createdAt,
  };
}
