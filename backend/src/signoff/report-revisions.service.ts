import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, FindOptionsWhere, In } from 'typeorm';
import type { Page, ReportRevisionView } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { BlindingService } from '../blinding/blinding.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { pageWindowOf } from '../common/pagination/page-query.dto';
import { RevisionListQueryDto } from './dto/revision-list-query.dto';
import { ReportFilesService } from './report-files.service';
import { ReportNotificationsService } from './report-notifications.service';
import { ReportRevision } from './report-revision.entity';
import { revisionFileName, RevisionViewsService } from './revision-views.service';
import type { PdfFile } from './signoff.service';
import { SignoffError, signoffError } from './signoff.errors';

/**
 * Signed revisions for reading and download. Scoped as reports are (a revision row carries
 * the report's study, site and a signed/sent state), so a coordinator sees the signed
 * revisions of their own site and nothing of any other, and no route changes a revision.
 */
@Injectable()
export class ReportRevisionsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly files: ReportFilesService,
    private readonly notifications: ReportNotificationsService,
    private readonly views: RevisionViewsService,
    private readonly blinding: BlindingService,
  ) {}

  async list(caller: Caller, query: RevisionListQueryDto): Promise<Page<ReportRevisionView>> {
    await this.notifications.markDelivered();
    const window = pageWindowOf(query, 'desc');
    const filters: FindOptionsWhere<ReportRevision> = {};
    if (query.state !== undefined) filters.state = query.state;
    for (const key of ['visitId', 'participantId', 'siteId', 'reportId'] as const) {
      const value = query[key];
      if (value !== undefined) filters[key] = value;
    }
    // Blinded review: an analyst lists only the revisions of visits they decided on.
    const open = await this.blinding.unblindedVisitIds(caller);
    if (open !== null) {
      filters.visitId = In(
        query.visitId === undefined ? open : open.filter((id) => id === query.visitId),
      );
    }
    const [rows, total] = await this.dataSource.getRepository(ReportRevision).findAndCount({
      where: scopedWhere<ReportRevision>(caller.ability, 'read', 'Report', filters),
      order: { [query.sort ?? 'signedAt']: window.order, id: window.order },
      skip: window.skip,
      take: window.take,
    });
    return {
      items: await this.views.of(this.dataSource.manager, rows),
      total,
      page: window.page,
      pageSize: window.pageSize,
    };
  }

  async get(caller: Caller, revisionId: string): Promise<ReportRevisionView> {
    const row = await this.inScope(caller, 'read', { id: revisionId }, revisionId);
    const [view] = await this.views.of(this.dataSource.manager, [row]);
    return view;
  }

  /** One revision's PDF, checked against its SHA-256; the download is audited. */
  async file(caller: Caller, revisionId: string): Promise<PdfFile> {
    const row = await this.inScope(caller, 'export', { id: revisionId }, revisionId);
    return this.serve(caller, row);
  }

  /** The newest signed revision of a report (what the Reports screen downloads). */
  async latestFileOfReport(caller: Caller, reportId: string): Promise<PdfFile> {
    const row = await this.dataSource.getRepository(ReportRevision).findOne({
      where: scopedWhere<ReportRevision>(caller.ability, 'export', 'Report', { reportId }),
      order: { revision: 'DESC' },
    });
    if (row === null) {
      throw signoffError(
        SignoffError.NotSignedYet,
        `Report ${reportId} has no signed revision to download.`,
        { reportId },
      );
    }
    await this.blinding.assertVisible(caller, { id: row.visitId, studyId: row.studyId });
    return this.serve(caller, row);
  }

  private async serve(caller: Caller, row: ReportRevision): Promise<PdfFile> {
    const bytes = await this.files.read(row.pdfSha256);
    const [view] = await this.views.of(this.dataSource.manager, [row]);
    await this.writes.run(() =>
      this.audit.record({
        actor: caller.user,
        action: 'download',
        objectType: 'Report',
        objectId: row.reportId,
        studyId: row.studyId,
        siteId: row.siteId,
        after: { revisionId: row.id, revision: row.revision, pdfSha256: row.pdfSha256 },
        clientIp: caller.clientIp,
      }),
    );
    return { bytes, sha256: row.pdfSha256, fingerprint: null, fileName: revisionFileName(view) };
  }

  private async inScope(
    caller: Caller,
    action: 'read' | 'export',
    where: FindOptionsWhere<ReportRevision>,
    revisionId: string,
  ): Promise<ReportRevision> {
    const row = await this.dataSource.getRepository(ReportRevision).findOne({
      where: scopedWhere<ReportRevision>(caller.ability, action, 'Report', where),
    });
    if (row === null) {
      throw signoffError(
        SignoffError.RevisionNotFound,
        `No signed report revision ${revisionId}.`,
        { revisionId },
      );
    }
    // A revision names the visit's participant, date and planned visit (blinded review).
    await this.blinding.assertVisible(caller, { id: row.visitId, studyId: row.studyId });
    return row;
  }
}
