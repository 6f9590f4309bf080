import { Column, Entity, Index } from 'typeorm';
import type { BandSource, RecordingKind, RunTrigger } from '@gyre/shared';
import { VisitColumns } from '../common/database/scoped-columns';

/**
 * The results of one finished computation. The headline numbers have their own columns
 * (for trajectories and lists); the rest is `summaryJson` (per-channel table, QC) and
 * `series`, a packed blob of the curves (see result-series-codec.ts).
 */
@Entity('analysis_run')
@Index('IDX_analysis_run_recording', ['recordingId', 'createdAt'])
@Index('IDX_analysis_run_visit', ['visitId', 'createdAt'])
export class AnalysisRun extends VisitColumns {
  @Column('varchar', { length: 36 }) recordingId: string;
  @Column('varchar', { length: 36 }) jobId: string;
  @Column('varchar', { length: 16 }) kind: RecordingKind;

  /** What started the run (upload, re-run, retry, the visit's resting IAF changing, …). */
  @Column('varchar', { length: 16 }) trigger: RunTrigger;
  @Column('varchar', { length: 36 }) settingsId: string;
  @Column('integer') settingsVersion: number;

  /** The effective `AnalysisSettings` (study version with the visit's override) as JSON. */
  @Column('text') settingsJson: string;

  /** The visit override revision in force, null without one. */
  @Column('integer', { nullable: true }) overrideRevision: number | null;

  /** The resting IAF the band followed, Hz; null when none was known. */
  @Column('real', { nullable: true }) iafHz: number | null;
  @Column('varchar', { length: 40 }) codeVersion: string;
  @Column('varchar', { length: 64 }) inputChecksumSha256: string;

  /** SHA-256 over the stored summary and curves: equal numbers, equal hash. */
  @Column('varchar', { length: 64, nullable: true }) resultsSha256: string | null;
  @Column('real') bandLowHz: number;
  @Column('real') bandHighHz: number;
  @Column('varchar', { length: 16 }) bandSource: BandSource;
  @Column('real', { nullable: true }) roiDeltaFHz: number | null;
  @Column('real', { nullable: true }) roiCiLowHz: number | null;
  @Column('real', { nullable: true }) roiCiHighHz: number | null;
  @Column('real', { nullable: true }) roiPValue: number | null;
  @Column('integer', { nullable: true }) trialsKept: number | null;
  @Column('integer', { nullable: true }) trialsTotal: number | null;
  @Column('real', { nullable: true }) pafHz: number | null;
  @Column('real', { nullable: true }) cogHz: number | null;
  @Column('boolean', { nullable: true }) suggestsSlowing: boolean | null;
  @Column('text') summaryJson: string;
  @Column('blob') series: Buffer;
  @Column('varchar', { length: 30 }) createdAt: string;
}
