import { randomUUID } from 'node:crypto';
import { Injectable, Logger } from '@nestjs/common';
import { OnEvent } from '@nestjs/event-emitter';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, FindOptionsWhere, In } from 'typeorm';
import type { Action, Page, ReportView } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { scopedWhere } from '../auth/access-scope';
import { blindedReportView } from '../blinding/blinded-views';
import { BlindingService } from '../blinding/blinding.service';
import type { Caller } from '../auth/decorators';
import { givenFields } from '../common/given-fields';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import { AnalysisEvents } from '../analysis/analysis.events';
import type { VisitResultsChanged } from '../analysis/analysis.events';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { ReportListQueryDto } from './dto/report-list-query.dto';
import { Report } from './report.entity';
import { ReportsError, reportsError } from './reports.errors';

/** The visit a report belongs to, with the columns its scope needs. */
type ReportVisit = Pick<VisitResultsChanged, 'visitId' | 'participantId' | 'studyId' | 'siteId'>;

/**
 * Visit reports: one per visit, created as a draft (audited) when the visit's first result
 * is computed. Their content is built when asked for (signoff/), so new numbers reach the
 * draft without this service being told more than "the visit has results".
 */
@Injectable()
export class ReportsService {
  private readonly logger = new Logger('Reports');

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly blinding: BlindingService,
  ) {}

  @OnEvent(AnalysisEvents.VisitResultsChanged, { async: true, promisify: true })
  async onVisitResults(event: VisitResultsChanged): Promise<void> {
    try {
      await this.writes.run((tx) => this.ensureDraft(tx, event));
    } catch (error) {
      this.logger.error(`Visit ${event.visitId}: ${String(error)}`);
    }
  }

  /** Inside a write transaction: the visit's report, created as a draft when missing. */
  async ensureDraft(manager: EntityManager, visit: ReportVisit): Promise<Report> {
    const found = await manager.getRepository(Report).findOneBy({ visitId: visit.visitId });
    if (found !== null) return found;
    const now = nowIso();
    const report = Object.assign(new Report(), {
      id: randomUUID(),
      visitId: visit.visitId,
      participantId: visit.participantId,
      studyId: visit.studyId,
      siteId: visit.siteId,
      state: 'draft' as const,
      createdAt: now,
      updatedAt: now,
    });
    await manager.getRepository(Report).insert(report);
    await this.audit.record({
      actor: null,
      action: 'create',
      objectType: 'Report',
      objectId: report.id,
      studyId: report.studyId,
      siteId: report.siteId,
      before: null,
      after: toReportView(report),
      reason: 'first result of the visit computed',
    });
    return report;
  }

  /** Inside the signing or mailing transaction: the report's new state (signed, then sent). */
  async setState(
    manager: EntityManager,
    reportId: string,
    state: 'signed' | 'sent',
    at: string = nowIso(),
  ): Promise<void> {
    await manager.getRepository(Report).update({ id: reportId }, { state, updatedAt: at });
  }

  async list(caller: Caller, query: ReportListQueryDto): Promise<Page<ReportView>> {
    const window = pageWindowOf(query, 'desc');
    const where: FindOptionsWhere<Report> = givenFields(query, [
      'state',
      'siteId',
      'participantId',
    ]);
    // Blinded review: an analyst lists only the reports of visits they decided on.
    const open = await this.blinding.unblindedVisitIds(caller);
    if (open !== null) where.visitId = In(open);
    const found = await this.dataSource.getRepository(Report).findAndCount({
      where: scopedWhere<Report>(caller.ability, 'read', 'Report', where),
      ...pageSliceOf(window, query.sort ?? 'createdAt', window.order),
    });
    return toPage(found, window, toReportView);
  }

  async forVisit(caller: Caller, visitId: string): Promise<ReportView> {
    const report = await this.dataSource.getRepository(Report).findOne({
      where: scopedWhere<Report>(caller.ability, 'read', 'Report', { visitId }),
    });
    if (report === null) {
      throw reportsError(ReportsError.NotFound, `No report for visit ${visitId}.`, {
        visitId,
      });
    }
    const clock = (await this.blinding.blindedVisits(caller, [visitId])).get(visitId)?.clock;
    return clock === undefined
      ? toReportView(report)
      : blindedReportView(toReportView(report), clock);
  }

  /** For other modules: the visit's report if the caller may `action` it, else null (their 404). */
  inScopeForVisit(caller: Caller, action: Action, visitId: string): Promise<Report | null> {
    return this.dataSource.getRepository(Report).findOne({
      where: scopedWhere<Report>(caller.ability, action, 'Report', { visitId }),
    });
  }

  /** For other modules holding the id (unscoped); `manager` reads inside their transaction. */
  byId(id: string, manager?: EntityManager): Promise<Report> {
    return (manager ?? this.dataSource.manager).getRepository(Report).findOneByOrFail({ id });
  }
}

export function toReportView(row: Report): ReportView {
  return {
    id: row.id,
    visitId: row.visitId,
    participantId: row.participantId,
    siteId: row.siteId,
    state: row.state,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}
