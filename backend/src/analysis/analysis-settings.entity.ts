import { Column, Entity, PrimaryColumn, Unique } from 'typeorm';

/**
 * One version of a study's analysis settings; a change adds a row, never edits one. The values
 * are the signal core's `AnalysisSettings`, stored as validated JSON, field for field.
 */
@Entity('analysis_settings')
@Unique('UQ_analysis_settings_version', ['studyId', 'version'])
export class AnalysisSettings {
  @PrimaryColumn('varchar', { length: 36 }) id: string;
  @Column('varchar', { length: 36 }) studyId: string;
  @Column('integer') version: number;

  /** JSON of `AnalysisSettings` (checked by `analysis-settings.rules.ts` before it is written). */
  @Column('text') valuesJson: string;
  @Column('text') reason: string;

  /** Null for the defaults Gyre writes itself as version 1. */
  @Column('varchar', { length: 36, nullable: true }) createdById: string | null;
  @Column('varchar', { length: 30 }) createdAt: string;
}
