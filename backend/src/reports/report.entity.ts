import { Column, Entity } from 'typeorm';
import type { ReportState } from '@gyre/shared';
import { StudySiteColumns } from '../common/database/scoped-columns';

/** The report of one visit. This issue only creates drafts; signing comes later. */
@Entity('report')
export class Report extends StudySiteColumns {
  @Column('varchar', { length: 36, unique: true }) visitId: string;
  @Column('varchar', { length: 36 }) participantId: string;
  @Column('varchar', { length: 16 }) state: ReportState;
  @Column('varchar', { length: 30 }) createdAt: string;
  @Column('varchar', { length: 30 }) updatedAt: string;
}
