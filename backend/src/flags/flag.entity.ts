import { Column, Entity, Index } from 'typeorm';
import type { FlagState } from '@gyre/shared';
import { VisitColumns } from '../common/database/scoped-columns';

/** A slowing flag on a visit: raised by an analyst with a reason, later perhaps cleared. */
@Entity('flag')
@Index('IDX_flag_visit', ['visitId', 'raisedAt'])
export class Flag extends VisitColumns {
  @Column('varchar', { length: 16 }) state: FlagState;
  @Column('varchar', { length: 36 }) raisedById: string;
  @Column('text') raiseReason: string;
  @Column('varchar', { length: 30 }) raisedAt: string;

  /** JSON of what the computation suggested when the flag was raised (for the record). */
  @Column('text', { nullable: true }) suggestionJson: string | null;
  @Column('varchar', { length: 36, nullable: true }) clearedById: string | null;
  @Column('text', { nullable: true }) clearReason: string | null;
  @Column('varchar', { length: 30, nullable: true }) clearedAt: string | null;
}
