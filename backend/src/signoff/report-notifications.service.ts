import { randomUUID } from 'node:crypto';
import { Inject, Injectable, OnModuleInit } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, In } from 'typeorm';
import { AuditService } from '../audit/audit.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { nowIso } from '../common/time';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { OutboxService } from '../mail/outbox.service';
import { ReportsService } from '../reports/reports.service';
import { UsersService } from '../users/users.service';
import { ReportNotification } from './report-notification.entity';
import { ReportRevision } from './report-revision.entity';
import { REPORT_SIGNED_KIND, reportSignedMail, revisionLink } from './report-signed-mail';

/**
 * E-mail to coordinators about a signed revision, through the mail outbox (which retries
 * with backoff until the SMTP server takes the message), and the step signed → sent once
 * every message of the revision is delivered.
 */
@Injectable()
export class ReportNotificationsService implements OnModuleInit {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly writes: WriteTransactionsService,
    private readonly outbox: OutboxService,
    private readonly audit: AuditService,
    private readonly reports: ReportsService,
    private readonly users: UsersService,
  ) {}

  onModuleInit(): void {
    // Delivery moves a revision to `sent` at once; reads also catch up (markDelivered).
    this.outbox.onSent(async (message) => {
      if (message.kind === REPORT_SIGNED_KIND) await this.markDelivered();
    });
  }

  /**
   * Inside the signing transaction: one message per active coordinator of the report's site,
   * each recorded and audited. Returns the addresses; call {@link send} after the commit.
   */
  async queueFor(
    manager: EntityManager,
    revision: ReportRevision,
    context: {
      site: { name: string };
      study: { code: string };
      participant: { code: string };
      visit: { label: string; visitDate: string };
    },
  ): Promise<string[]> {
    const coordinators = await this.users.activeCoordinatorsOf(
      revision.studyId,
      revision.siteId,
      manager,
    );
    const link = revisionLink(this.config.publicUrl, revision.id);
    for (const coordinator of coordinators) {
      const content = reportSignedMail({
        name: coordinator.name,
        siteName: context.site.name,
        studyCode: context.study.code,
        participantCode: context.participant.code,
        visitLabel: context.visit.label,
        visitDate: context.visit.visitDate,
        revision: revision.revision,
        signedAt: revision.signedAt,
        link,
      });
      const outboxMessageId = await this.outbox.enqueue(manager, coordinator.email, content);
      await manager.insert(ReportNotification, {
        id: randomUUID(),
        revisionId: revision.id,
        outboxMessageId,
        recipientUserId: coordinator.id,
        toAddress: coordinator.email,
        createdAt: nowIso(),
      });
      await this.audit.record({
        actor: null,
        action: 'notify',
        objectType: 'Report',
        objectId: revision.reportId,
        studyId: revision.studyId,
        siteId: revision.siteId,
        after: {
          revisionId: revision.id,
          revision: revision.revision,
          to: coordinator.email,
          outboxMessageId,
        },
        reason: 'report signed: coordinator of the site informed',
      });
    }
    return coordinators.map((c) => c.email);
  }

  /** Hands queued messages to the outbox sender (after the transaction has committed). */
  send(): void {
    this.outbox.kick();
  }

  /**
   * Marks `sent` every signed revision whose messages have all been delivered, and its
   * report too when that revision is still the latest. Idempotent; returns what changed.
   */
  async markDelivered(): Promise<string[]> {
    const pending = await this.dataSource.getRepository(ReportRevision).find({
      where: { state: 'signed' },
      select: { id: true },
    });
    if (pending.length === 0) return [];
    const ids = pending.map((r) => r.id);
    const notifications = await this.dataSource
      .getRepository(ReportNotification)
      .find({ where: { revisionId: In(ids) } });
    if (notifications.length === 0) return [];
    const messages = await this.outbox.deliveryOf(notifications.map((n) => n.outboxMessageId));
    const byId = new Map(messages.map((m) => [m.id, m]));
    const delivered: string[] = [];
    for (const revisionId of new Set(notifications.map((n) => n.revisionId))) {
      const mine = notifications
        .filter((n) => n.revisionId === revisionId)
        .map((n) => byId.get(n.outboxMessageId));
      if (!mine.every((m) => m !== undefined && m.state === 'sent')) continue;
      const sentAt = mine
        .map((m) => m?.sentAt ?? '')
        .sort()
        .pop();
      if (await this.markSent(revisionId, sentAt ?? nowIso())) delivered.push(revisionId);
    }
    return delivered;
  }

  private markSent(revisionId: string, sentAt: string): Promise<boolean> {
    return this.writes.run(async (manager) => {
      const revision = await manager.findOneBy(ReportRevision, { id: revisionId });
      if (revision === null || revision.state !== 'signed') return false;
      await manager.update(ReportRevision, { id: revisionId }, { state: 'sent', sentAt });
      const report = await this.reports.byId(revision.reportId, manager);
      const latest = await manager.findOne(ReportRevision, {
        where: { reportId: report.id },
        order: { revision: 'DESC' },
        select: { id: true },
      });
      const reportSent = report.state === 'signed' && latest?.id === revisionId;
      if (reportSent) {
        await this.reports.setState(manager, report.id, 'sent');
      }
      await this.audit.record({
        actor: null,
        action: 'sent',
        objectType: 'Report',
        objectId: report.id,
        studyId: report.studyId,
        siteId: report.siteId,
        before: { revisionId, revision: revision.revision, state: 'signed' },
        after: { revisionId, revision: revision.revision, state: 'sent', sentAt },
        reason: 'every coordinator e-mail of the revision was delivered',
      });
      return true;
    });
  }
}
