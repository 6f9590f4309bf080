import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** Which outbox message told which coordinator about which signed revision. */
@Entity('report_notification')
@Index('IDX_report_notification_revision', ['revisionId'])
@Index('IDX_report_notification_message', ['outboxMessageId'], { unique: true })
export class ReportNotification {
  @PrimaryColumn('varchar', { length: 36 }) id: string;
  @Column('varchar', { length: 36 }) revisionId: string;
  @Column('varchar', { length: 36 }) outboxMessageId: string;
  @Column('varchar', { length: 36 }) recipientUserId: string;
  @Column('varchar', { length: 254 }) toAddress: string;
  @Column('varchar', { length: 30 }) createdAt: string;
}
