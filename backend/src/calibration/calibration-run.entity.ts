import { Column, Entity, Index } from 'typeorm';
import type { CalibrationState } from '@gyre/shared';
import { StudySiteColumns } from '../common/database/scoped-columns';

/**
 * One calibration run of a site: Gyre's generated recording computed through the job queue
 * and the analysis code, compared with its known answers. A table of its own, never a
 * participant, visit or recording, so no study list, export or count can include it.
 */
@Entity('calibration_run')
@Index('IDX_calibration_run_site', ['siteId', 'requestedAt'])
@Index('IDX_calibration_run_study', ['studyId', 'requestedAt'])
export class CalibrationRun extends StudySiteColumns {
  @Column('varchar', { length: 16 }) state: CalibrationState;
  @Column('varchar', { length: 64 }) signalName: string;

  /** The study's settings version computed with, and its values as JSON. */
  @Column('varchar', { length: 36 }) settingsVersionId: string;
  @Column('integer') settingsVersion: number;
  @Column('text') settingsJson: string;
  @Column('varchar', { length: 32 }) gyreVersion: string;

  /** SHA-256 of the two generated files the computation must read. */
  @Column('varchar', { length: 64 }) restSha256: string;
  @Column('varchar', { length: 64 }) taskSha256: string;

  /** JSON of `CalibrationCheckView[]`; `[]` until the run is finished. */
  @Column('text') checksJson: string;
  @Column('text', { nullable: true }) error: string | null;
  @Column('varchar', { length: 36 }) requestedById: string;
  @Column('varchar', { length: 30 }) requestedAt: string;
  @Column('varchar', { length: 30, nullable: true }) finishedAt: string | null;
}
