import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * One audit entry. Rows are written only by `AuditService` (raw, inside one transaction with
 * the read of the previous hash); SQLite triggers refuse UPDATE and DELETE.
 */
@Entity('audit_entry')
export class AuditEntry {
  @PrimaryColumn('integer') seq: number;
  @Column('varchar') at: string;
  @Column({ type: 'varchar', nullable: true }) actorId: string | null;
  @Column({ type: 'varchar', nullable: true }) actorEmail: string | null;
  @Column('varchar') action: string;
  @Column('varchar') objectType: string;
  @Column({ type: 'varchar', nullable: true }) objectId: string | null;
  @Column({ type: 'varchar', nullable: true }) studyId: string | null;
  @Column({ type: 'varchar', nullable: true }) siteId: string | null;

  /** Canonical JSON text, or null. */
  @Column({ type: 'text', nullable: true }) before: string | null;
  @Column({ type: 'text', nullable: true }) after: string | null;
  @Column({ type: 'text', nullable: true }) reason: string | null;
  @Column({ type: 'varchar', nullable: true }) clientIp: string | null;
  @Column('varchar') prevHash: string;
  @Column('varchar') hash: string;
}
