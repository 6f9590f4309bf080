import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { OutboxState } from '@gyre/shared';

/** An e-mail waiting to be sent, or the record that it was (its body is blanked once sent). */
@Entity('outbox_message')
export class OutboxMessage {
  @PrimaryColumn('varchar') id: string;
  @Column('varchar') kind: string;
  @Column('varchar') toAddress: string;
  @Column('varchar') subject: string;

  /** Holds single-use links, so it is cleared as soon as the message is handed to SMTP. */
  @Column({ type: 'text', nullable: true }) textBody: string | null;
  @Column('varchar') state: OutboxState;
  @Column('integer') attempts: number;
  @Column({ type: 'varchar', nullable: true }) nextAttemptAt: string | null;
  @Column({ type: 'text', nullable: true }) lastError: string | null;
  @Column({ type: 'varchar', nullable: true }) messageId: string | null;
  @Column('varchar') createdAt: string;
  @Column({ type: 'varchar', nullable: true }) sentAt: string | null;
}
