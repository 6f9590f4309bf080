import { Column, Entity, PrimaryColumn, Unique } from 'typeorm';
import type { AnalysisMethod } from '@gyre/shared';

/** One version of a study's analysis settings; a change adds a row, never edits one. */
@Entity('analysis_settings')
@Unique('UQ_analysis_settings_version', ['studyId', 'version'])
export class AnalysisSettings {
  @PrimaryColumn('varchar', { length: 36 })
  id: string;

  @Column('varchar', { length: 36 })
  studyId: string;

  @Column('integer')
  version: number;

  /** Null: the visit's resting IAF ± 2 Hz when there is one, else 8–13 Hz. */
  @Column('real', { nullable: true })
  bandLowHz: number | null;

  @Column('real', { nullable: true })
  bandHighHz: number | null;

  @Column('varchar', { length: 16 })
  method: AnalysisMethod;

  @Column('real')
  morletCycles: number;

  @Column('real')
  epochStartS: number;

  @Column('real')
  epochEndS: number;

  @Column('real')
  baselineStartS: number;

  @Column('real')
  baselineEndS: number;

  @Column('real')
  postStartS: number;

  @Column('real')
  postEndS: number;

  @Column('real')
  rejectionThresholdUv: number;

  @Column('real')
  flagThresholdHz: number;

  /** JSON list of 10-10 channel names. */
  @Column('text')
  roiJson: string;

  @Column('varchar', { length: 200, nullable: true })
  onsetLabel: string | null;

  @Column('text')
  reason: string;

  /** Null for the defaults Gyre writes itself as version 1. */
  @Column('varchar', { length: 36, nullable: true })
  createdById: string | null;

  @Column('varchar', { length: 30 })
  createdAt: string;
}
