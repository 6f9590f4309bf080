import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { ReportState } from '@gyre/shared';

/** The report of one visit. This issue only creates drafts; signing comes later. */
@Entity('report')
export class Report {
  @PrimaryColumn('varchar', { length: 36 })
  id: string;

  @Column('varchar', { length: 36, unique: true })
  visitId: string;

  @Column('varchar', { length: 36 })
  participantId: string;

  @Column('varchar', { length: 36 })
  studyId: string;

  @Column('varchar', { length: 36 })
  siteId: string;

  @Column('varchar', { length: 16 })
  state: ReportState;

  @Column('varchar', { length: 30 })
  createdAt: string;

  @Column('varchar', { length: 30 })
  updatedAt: string;
}
