import { Column, Entity, Unique } from 'typeorm';
import { StudySiteColumns } from '../common/database/scoped-columns';

/**
 * One revision of a visit's own analysis choices (region of interest, band, onset label) over
 * the study's settings; a change adds a revision, never edits one. Values: JSON of
 * `VisitAnalysisOverrideValues`.
 */
@Entity('visit_analysis_override')
@Unique('UQ_visit_analysis_override_revision', ['visitId', 'revision'])
export class VisitAnalysisOverride extends StudySiteColumns {
  @Column('varchar', { length: 36 }) visitId: string;
  @Column('integer') revision: number;
  @Column('text') valuesJson: string;
  @Column('text') reason: string;
  @Column('varchar', { length: 36 }) createdById: string;
  @Column('varchar', { length: 30 }) createdAt: string;
}
