import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, FindOptionsWhere } from 'typeorm';
import type { Page, ReportDto } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import { Recording } from '../recordings/recording.entity';
import { ReportListQueryDto } from './dto/report-list-query.dto';
import { Report } from './report.entity';
import { ReportsError } from './reports.errors';

/**
 * Visit reports. Here only drafts exist: one per visit, created (audited) when the visit's
 * first computation finishes. Signing comes in a later issue.
 */
@Injectable()
export class ReportsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
  ) {}

  /** Inside a write transaction: the visit's report, created as a draft when missing. */
  async ensureDraft(manager: EntityManager, recording: Recording): Promise<Report> {
    const found = await manager.getRepository(Report).findOneBy({ visitId: recording.visitId });
    if (found !== null) return found;
    const now = nowIso();
    const report = Object.assign(new Report(), {
      id: randomUUID(),
      visitId: recording.visitId,
      participantId: recording.participantId,
      studyId: recording.studyId,
      siteId: recording.siteId,
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
      after: toReportDto(report),
      reason: 'first result of the visit computed',
    });
    return report;
  }

  async list(caller: Caller, query: ReportListQueryDto): Promise<Page<ReportDto>> {
    const window = pageWindowOf(query, 'desc');
    const filters: Partial<Record<'state' | 'siteId' | 'participantId', string>> = {};
    for (const key of ['state', 'siteId', 'participantId'] as const) {
      const value = query[key];
      if (value !== undefined) filters[key] = value;
    }
    const found = await this.dataSource.getRepository(Report).findAndCount({
      where: scopedWhere<Report>(
        caller.ability,
        'read',
        'Report',
        filters as FindOptionsWhere<Report>,
      ),
      order: { [query.sort ?? 'createdAt']: window.order, id: window.order },
      skip: window.skip,
      take: window.take,
    });
    return toPage(found, window, toReportDto);
  }

  async forVisit(caller: Caller, visitId: string): Promise<ReportDto> {
    const report = await this.dataSource.getRepository(Report).findOne({
      where: scopedWhere<Report>(caller.ability, 'read', 'Report', { visitId }),
    });
    if (report === null) {
      throw new GyreException(
        ErrorKind.NotFound,
        ReportsError.NotFound,
        `No report for visit ${visitId}.`,
        {
          visitId,
        },
      );
    }
    return toReportDto(report);
  }
}

export function toReportDto(row: Report): ReportDto {
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
