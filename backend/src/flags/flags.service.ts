import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, In } from 'typeorm';
import type { FlagView, FlagSuggestion, Page, VisitFlagView } from '@gyre/shared';
import { AnalysisRunsService, roiCiOf, roiUsageOf } from '../analysis/analysis-runs.service';
import { parseStoredSettings } from '../analysis/settings-values';
import { AuditService } from '../audit/audit.service';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { blindedFlagView } from '../blinding/blinded-views';
import { BlindingService } from '../blinding/blinding.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { givenFields } from '../common/given-fields';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import type { Visit } from '../visits/visit.entity';
import { VisitsService } from '../visits/visits.service';
import { FlagListQueryDto } from './dto/flag-list-query.dto';
import { Flag } from './flag.entity';
import { FlagsError, flagsError } from './flags.errors';
import type { GyreException } from '../common/errors/gyre.exception';

/**
 * Slowing flags on visits. Only an analyst raises or clears one, with a reason; the
 * computation's suggestion is shown beside it and never raises a flag by itself.
 */
@Injectable()
export class FlagsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly runs: AnalysisRunsService,
    private readonly visits: VisitsService,
    private readonly blinding: BlindingService,
  ) {}

  async forVisit(caller: Caller, visitId: string): Promise<VisitFlagView> {
    await this.visits.findInScopeOf(caller, 'read', 'Flag', visitId, visitNotFound);
    const history = await this.dataSource
      .getRepository(Flag)
      .find({ where: { visitId }, order: { raisedAt: 'DESC', id: 'DESC' } });
    const current = history.find((f) => f.state === 'raised') ?? null;
    // Blinded review: when colleagues flagged the visit would tell the analyst roughly when it was.
    const clock = await this.blinding.clockOf(caller, visitId);
    const shown = (flag: Flag): FlagView =>
      clock === null ? toFlagView(flag) : blindedFlagView(toFlagView(flag), clock);
    return {
      visitId,
      current: current === null ? null : shown(current),
      suggestion: await this.suggestion(visitId),
      history: history.map(shown),
    };
  }

  async list(caller: Caller, query: FlagListQueryDto): Promise<Page<FlagView>> {
    const window = pageWindowOf(query, 'desc');
    const filters = givenFields(query, ['state', 'participantId', 'siteId']);
    const found = await this.dataSource.getRepository(Flag).findAndCount({
      where: scopedWhere<Flag>(caller.ability, 'read', 'Flag', filters),
      ...pageSliceOf(window, query.sort ?? 'raisedAt', window.order),
    });
    const blinded = await this.blinding.blindedVisits(caller, [
      ...new Set(found[0].map((flag) => flag.visitId)),
    ]);
    return toPage(found, window, (flag) => {
      const visit = blinded.get(flag.visitId);
      return visit === undefined
        ? toFlagView(flag)
        : blindedFlagView(toFlagView(flag), visit.clock);
    });
  }

  async raise(caller: Caller, visitId: string, reason: string): Promise<VisitFlagView> {
    const visit = await this.visits.findInScopeOf(caller, 'create', 'Flag', visitId, visitNotFound);
    await this.writes.run((manager) => this.raiseIn(manager, caller, visit, reason));
    return this.forVisit(caller, visitId);
  }

  /**
   * Raises the flag inside the caller's write transaction `manager` (blinded review records a
   * decision and the unblinding together); the caller has checked the visit's scope.
   */
  async raiseIn(
    manager: EntityManager,
    caller: Caller,
    visit: Visit,
    reason: string,
  ): Promise<Flag> {
    const visitId = visit.id;
    const raised = await manager.getRepository(Flag).findOneBy({ visitId, state: 'raised' });
    if (raised !== null) {
      throw flagsError(
        FlagsError.AlreadyRaised,
        `Visit ${visitId} already has a raised slowing flag (${raised.id}); clear it first.`,
        { flagId: raised.id },
      );
    }
    const suggestion = await this.suggestion(visitId);
    const flag = Object.assign(new Flag(), {
      id: randomUUID(),
      visitId,
      participantId: visit.participantId,
      studyId: visit.studyId,
      siteId: visit.siteId,
      state: 'raised' as const,
      raisedById: caller.user.id,
      raiseReason: reason,
      raisedAt: nowIso(),
      suggestionJson: suggestion === null ? null : JSON.stringify(suggestion),
      clearedById: null,
      clearReason: null,
      clearedAt: null,
    });
    await manager.getRepository(Flag).insert(flag);
    await this.audit.recordBy(caller, visit, {
      action: 'raise',
      objectType: 'Flag',
      objectId: flag.id,
      before: { visitId, state: null },
      after: { ...toFlagView(flag), suggestion },
      reason,
    });
    return flag;
  }

  async clear(caller: Caller, visitId: string, reason: string): Promise<VisitFlagView> {
    const visit = await this.visits.findInScopeOf(caller, 'update', 'Flag', visitId, visitNotFound);
    await this.writes.run(async (manager) => {
      const raised = await manager.getRepository(Flag).findOneBy({ visitId, state: 'raised' });
      if (raised === null) {
        throw flagsError(
          FlagsError.NotRaised,
          `Visit ${visitId} has no raised slowing flag to clear.`,
          { visitId },
        );
      }
      const before = toFlagView(raised);
      const changes = {
        state: 'cleared' as const,
        clearedById: caller.user.id,
        clearReason: reason,
        clearedAt: nowIso(),
      };
      await manager.getRepository(Flag).update({ id: raised.id }, changes);
      await this.audit.recordBy(caller, visit, {
        action: 'clear',
        objectType: 'Flag',
        objectId: raised.id,
        before,
        after: toFlagView(Object.assign(raised, changes)),
        reason,
      });
    });
    return this.forVisit(caller, visitId);
  }

  /**
   * For other modules, unscoped: every flag of the visits, newest raised first; pass `manager`
   * inside a transaction.
   */
  async forVisits(visitIds: string[], manager?: EntityManager): Promise<Flag[]> {
    if (visitIds.length === 0) return [];
    return (manager ?? this.dataSource.manager).getRepository(Flag).find({
      where: { visitId: In(visitIds) },
      order: { raisedAt: 'DESC', id: 'DESC' },
    });
  }

  /** What the numbers of the visit's current task recording suggest (docs/method.md §3). */
  private async suggestion(visitId: string): Promise<FlagSuggestion | null> {
    const [run] = (await this.runs.currentRunsOfVisits([visitId])).filter((r) => r.kind === 'task');
    if (run === undefined) return null;
    return {
      suggestsSlowing: Boolean(run.suggestsSlowing),
      runId: run.id,
      roiDeltaFHz: run.roiDeltaFHz,
      roiCiHz: roiCiOf(run),
      flagThresholdHz: parseStoredSettings(run.settingsJson).flagThresholdHz,
      roiUsage: roiUsageOf(run),
    };
  }
}

function visitNotFound(visitId: string): GyreException {
  return flagsError(FlagsError.VisitNotFound, `No visit ${visitId}.`, { visitId });
}

export function toFlagView(flag: Flag): FlagView {
  return {
    id: flag.id,
    visitId: flag.visitId,
    state: flag.state,
    raisedById: flag.raisedById,
    raiseReason: flag.raiseReason,
    raisedAt: flag.raisedAt,
    clearedById: flag.clearedById,
    clearReason: flag.clearReason,
    clearedAt: flag.clearedAt,
  };
}
