import { Column, Entity, Index } from 'typeorm';
import type { RevisionState } from '@gyre/shared';
import { VisitColumns } from '../common/database/scoped-columns';

/**
 * One signed revision of a visit report. Written once at signing; SQLite triggers refuse any
 * change but `state`/`sentAt` (signed → sent) and any DELETE, so a signed report never
 * changes by any route or query. The PDF itself is stored by its SHA-256.
 */
@Entity('report_revision')
@Index('IDX_report_revision_number', ['reportId', 'revision'], { unique: true })
@Index('IDX_report_revision_site', ['siteId', 'signedAt'])
export class ReportRevision extends VisitColumns {
  @Column('varchar', { length: 36 }) reportId: string;
  @Column('integer') revision: number;

  /** Scoped like a report: coordinators may read `signed` and `sent` rows of their site. */
  @Column('varchar', { length: 16 }) state: RevisionState;
  @Column('varchar', { length: 36 }) signedById: string;

  /** The name as printed on the PDF (§11.50(a)(1)), kept even if the account is renamed. */
  @Column('varchar', { length: 200 }) signerName: string;
  @Column('varchar', { length: 254 }) signerEmail: string;
  @Column('varchar', { length: 30 }) signedAt: string;
  @Column('varchar', { length: 200 }) meaning: string;

  /** SHA-256 over the report's content when signed: later changes make it differ. */
  @Column('varchar', { length: 64 }) contentFingerprint: string;
  @Column('varchar', { length: 64 }) pdfSha256: string;
  @Column('integer') pdfSizeBytes: number;
  @Column('varchar', { length: 36, nullable: true }) supersedesId: string | null;
  @Column('varchar', { length: 30, nullable: true }) sentAt: string | null;
}
