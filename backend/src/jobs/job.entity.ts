import { Column, Entity, Index, PrimaryColumn } from 'typeorm';
import type { JobState } from '@gyre/shared';

/** One computation of one recording with one settings version; the queue is this table. */
@Entity('job')
@Index('IDX_job_state', ['state', 'createdAt'])
@Index('IDX_job_recording', ['recordingId', 'createdAt'])
export class Job {
  @PrimaryColumn('varchar', { length: 36 })
  id: string;

  @Column('varchar', { length: 36 })
  recordingId: string;

  @Column('varchar', { length: 36 })
  settingsId: string;

  @Column('varchar', { length: 16 })
  state: JobState;

  /** Attempts started so far (a start counts even when the server dies during it). */
  @Column('integer', { default: 0 })
  attempts: number;

  @Column('integer', { default: 3 })
  maxAttempts: number;

  @Column('integer', { default: 0 })
  progressPercent: number;

  @Column('text', { nullable: true })
  error: string | null;

  @Column('varchar', { length: 36 })
  requestedById: string;

  @Column('varchar', { length: 30 })
  createdAt: string;

  @Column('varchar', { length: 30, nullable: true })
  startedAt: string | null;

  @Column('varchar', { length: 30, nullable: true })
  finishedAt: string | null;
}
