import { Column, Entity, PrimaryColumn, Unique } from 'typeorm';

/**
 * One revision of a visit's own analysis choices (region of interest, band, onset label) over
 * the study's settings; a change adds a revision, never edits one. Values: JSON of
 * `VisitAnalysisOverrideValues`.
 */
@Entity('visit_analysis_override')
@Unique('UQ_visit_analysis_override_revision', ['visitId', 'revision'])
export class VisitAnalysisOverride {
  @PrimaryColumn('varchar', { length: 36 })
  id: string;

  @Column('varchar', { length: 36 })
  visitId: string;

  @Column('varchar', { length: 36 })
  studyId: string;

  @Column('varchar', { length: 36 })
  siteId: string;

  @Column('integer')
  revision: number;

  @Column('text')
  valuesJson: string;

  @Column('text')
  reason: string;

  @Column('varchar', { length: 36 })
  createdById: string;

  @Column('varchar', { length: 30 })
  createdAt: string;
}
