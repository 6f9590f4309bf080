import { Column, Entity, Index } from 'typeorm';
import type { BlindedDecision } from '@gyre/shared';
import { VisitColumns } from '../common/database/scoped-columns';

/**
 * An analyst's decision on a blinded visit, which unblinded the visit for that analyst alone.
 * One row per analyst and visit; rows are only ever added.
 */
@Entity('visit_unblinding')
@Index('UQ_visit_unblinding_user_visit', ['userId', 'visitId'], { unique: true })
export class VisitUnblinding extends VisitColumns {
  @Column('varchar', { length: 36 }) userId: string;
  @Column('varchar', { length: 16 }) decision: BlindedDecision;
  @Column('text') reason: string;

  /** The raised flag the `flag` decision stands on. */
  @Column('varchar', { length: 36, nullable: true }) flagId: string | null;
  @Column('varchar', { length: 30 }) unblindedAt: string;
}
