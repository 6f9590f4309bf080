import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager } from 'typeorm';
import { SIGNATURE_MEANING, subject } from '@gyre/shared';
import type { Action, ReportRevisionView, ReportSignOffView } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { BlindingService } from '../blinding/blinding.service';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import { VisitReportModel } from '../report-document/visit-report-model';
import type { Report } from '../reports/report.entity';
import { ReportsService, toReportView } from '../reports/reports.service';
import { SignReportDto } from './dto/sign-report.dto';
import { ReportFilesService } from './report-files.service';
import { ReportRenderingService } from './report-rendering.service';
import { ReportNotificationsService } from './report-notifications.service';
import { ReportRevision } from './report-revision.entity';
import { revisionFileName, RevisionViewsService } from './revision-views.service';
import { SignerVerificationService } from './signer-verification.service';
import { SignoffError, signoffError } from './signoff.errors';
import { ReportContent, VisitReportContentService } from './visit-report-content.service';

export interface PdfFile {
  bytes: Buffer;
  fileName: string;
  sha256: string | null;
  fingerprint: string | null;
}

/**
 * Sign-off of visit reports: the draft preview, the signature (password again, the stated
 * meaning, the content the signer saw) and immutable revisions stored by SHA-256.
 *
 * The report's state follows draft → signed → sent and then tells the state of its newest
 * signed revision. New results or a changed flag after signing never touch a signed revision:
 * they change the draft's fingerprint, so `pendingRevision` says the next signature makes a
 * new revision, and the earlier ones stay as they are.
 */
@Injectable()
export class SignoffService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly content: VisitReportContentService,
    private readonly files: ReportFilesService,
    private readonly signer: SignerVerificationService,
    private readonly notifications: ReportNotificationsService,
    private readonly renderer: ReportRenderingService,
    private readonly reports: ReportsService,
    private readonly views: RevisionViewsService,
    private readonly blinding: BlindingService,
  ) {}

  async status(caller: Caller, visitId: string): Promise<ReportSignOffView> {
    await this.notifications.markDelivered();
    const report = await this.reportInScope(caller, visitId, 'read');
    const content = await this.content.build(this.dataSource.manager, report);
    const revisions = await this.revisionsOf(this.dataSource.manager, report.id);
    const latest = revisions[0] ?? null;
    const changed = latest === null || latest.contentFingerprint !== content.fingerprint;
    const maySign = caller.ability.can('sign', subject('Report', report));
    const cannotSignReason = !content.hasResults
      ? 'No recording of this visit has a result yet.'
      : !changed
        ? `Revision ${latest?.revision} is signed and nothing has changed since.`
        : !maySign
          ? 'Your role does not sign reports.'
          : null;
    return {
      report: toReportView(report),
      meaning: SIGNATURE_MEANING,
      draftFingerprint: content.hasResults ? content.fingerprint : null,
      pendingRevision: content.hasResults && changed ? (latest?.revision ?? 0) + 1 : null,
      canSign: cannotSignReason === null,
      cannotSignReason,
      revisions: await this.views.of(this.dataSource.manager, revisions),
    };
  }

  /** The draft as it would be signed now, marked DRAFT; rendered on demand, never stored. */
  async preview(caller: Caller, visitId: string): Promise<PdfFile> {
    const report = await this.reportInScope(caller, visitId, 'read');
    const content = await this.content.build(this.dataSource.manager, report);
    const latest = (await this.revisionsOf(this.dataSource.manager, report.id))[0] ?? null;
    const revision = (latest?.revision ?? 0) + 1;
    const bytes = await this.renderer.render(
      this.modelOf(content, {
        revision,
        generatedAtIso: nowIso(),
        supersedes:
          latest === null ? null : { revision: latest.revision, sha256: latest.pdfSha256 },
        signature: null,
      }),
    );
    await this.writes.run(() =>
      this.audit.record({
        actor: caller.user,
        action: 'preview',
        objectType: 'Report',
        objectId: report.id,
        studyId: report.studyId,
        siteId: report.siteId,
        after: { revision, fingerprint: content.fingerprint },
        clientIp: caller.clientIp,
      }),
    );
    return {
      bytes,
      sha256: null,
      fingerprint: content.fingerprint,
      fileName: revisionFileName({
        participantCode: content.participant.code,
        visitLabel: content.visit.label,
        revision: null,
      }),
    };
  }

  async sign(caller: Caller, visitId: string, input: SignReportDto): Promise<ReportRevisionView> {
    if (input.meaning.trim() !== SIGNATURE_MEANING) {
      throw signoffError(
        SignoffError.WrongMeaning,
        `meaning: found ${JSON.stringify(input.meaning)}, expected ${JSON.stringify(SIGNATURE_MEANING)}`,
        { field: 'meaning', found: input.meaning, expected: SIGNATURE_MEANING },
      );
    }
    const report = await this.reportInScope(caller, visitId, 'sign');
    const signer = await this.signer.verify(caller, input.password, report.id);

    // Render outside the transaction (it takes a moment); check again inside that nothing moved.
    const content = await this.content.build(this.dataSource.manager, report);
    const latest = (await this.revisionsOf(this.dataSource.manager, report.id))[0] ?? null;
    assertSignable(content, latest, input.fingerprint);
    const signedAt = nowIso();
    const revisionNumber = (latest?.revision ?? 0) + 1;
    const pdf = await this.renderer.render(
      this.modelOf(content, {
        revision: revisionNumber,
        generatedAtIso: signedAt,
        supersedes:
          latest === null ? null : { revision: latest.revision, sha256: latest.pdfSha256 },
        signature: { signerName: signer.name, signedAtIso: signedAt, meaning: SIGNATURE_MEANING },
      }),
    );
    const pdfSha256 = await this.files.store(pdf);

    const revision = await this.writes.run(async (manager) => {
      const now = await this.content.build(manager, report);
      const latestNow = (await this.revisionsOf(manager, report.id))[0] ?? null;
      if ((latestNow?.id ?? null) !== (latest?.id ?? null)) {
        throw signoffError(
          SignoffError.AlreadySigned,
          `Someone signed revision ${latestNow?.revision} of this report meanwhile; review it again.`,
          { revision: latestNow?.revision ?? null },
        );
      }
      assertSignable(now, latestNow, input.fingerprint);
      const before = await this.reports.byId(report.id, manager);
      const row: ReportRevision = Object.assign(new ReportRevision(), {
        id: randomUUID(),
        reportId: report.id,
        visitId: report.visitId,
        participantId: report.participantId,
        studyId: report.studyId,
        siteId: report.siteId,
        revision: revisionNumber,
        state: 'signed' as const,
        signedById: signer.id,
        signerName: signer.name,
        signerEmail: signer.email,
        signedAt,
        meaning: SIGNATURE_MEANING,
        contentFingerprint: content.fingerprint,
        pdfSha256,
        pdfSizeBytes: pdf.length,
        supersedesId: latest?.id ?? null,
        sentAt: null,
      });
      await manager.insert(ReportRevision, row);
      await this.reports.setState(manager, report.id, 'signed', signedAt);
      const [view] = await this.views.of(manager, [row]);
      await this.audit.record({
        actor: caller.user,
        action: 'sign',
        objectType: 'Report',
        objectId: report.id,
        studyId: report.studyId,
        siteId: report.siteId,
        before: toReportView(before),
        after: {
          ...toReportView({ ...before, state: 'signed', updatedAt: signedAt }),
          revision: view,
        },
        reason: `electronic signature, meaning: ${SIGNATURE_MEANING}`,
        clientIp: caller.clientIp,
      });
      await this.notifications.queueFor(manager, row, {
        site: now.site,
        study: now.study,
        participant: now.participant,
        visit: now.visit,
      });
      return view;
    });
    this.notifications.send();
    return revision;
  }

  private modelOf(
    content: ReportContent,
    extra: Pick<VisitReportModel, 'revision' | 'generatedAtIso' | 'supersedes' | 'signature'>,
  ): VisitReportModel {
    return { ...content.body, ...extra };
  }

  private revisionsOf(manager: EntityManager, reportId: string): Promise<ReportRevision[]> {
    return manager.find(ReportRevision, { where: { reportId }, order: { revision: 'DESC' } });
  }

  private async reportInScope(caller: Caller, visitId: string, action: Action): Promise<Report> {
    const report = await this.reports.inScopeForVisit(caller, action, visitId);
    if (report === null) {
      throw signoffError(SignoffError.ReportNotFound, `No report for visit ${visitId}.`, {
        visitId,
      });
    }
    // Reports are signed unblinded: sign-off shows everything, so only after the decision.
    await this.blinding.assertVisible(caller, { id: report.visitId, studyId: report.studyId });
    return report;
  }
}

function assertSignable(
  content: ReportContent,
  latest: ReportRevision | null,
  fingerprint: string,
): void {
  if (!content.hasResults) {
    throw signoffError(
      SignoffError.NothingToSign,
      'No recording of this visit has a result yet: there is nothing to sign.',
    );
  }
  if (latest !== null && latest.contentFingerprint === content.fingerprint) {
    throw signoffError(
      SignoffError.AlreadySigned,
      `Revision ${latest.revision} is signed and nothing has changed since; a signed report is not signed again.`,
      { revision: latest.revision, revisionId: latest.id },
    );
  }
  if (content.fingerprint !== fingerprint) {
    throw signoffError(
      SignoffError.ContentChanged,
      'fingerprint: the visit changed since this draft was previewed (new results or a flag); preview it again before signing.',
      { field: 'fingerprint', found: fingerprint, expected: content.fingerprint },
    );
  }
}
