import { Column, Entity, Index, PrimaryColumn } from 'typeorm';
import type { JobState } from '@gyre/shared';

/**
 * One job of the embedded queue. The queue knows lanes, subjects and opaque JSON payloads,
 * never what a job is about: `subjectId` is whatever id the producer wants to look jobs up by.
 */
@Entity('job')
@Index('IDX_job_lane_state', ['lane', 'state', 'runAfter', 'createdAt'])
@Index('IDX_job_subject', ['subjectId', 'createdAt'])
export class QueueJob {
  @PrimaryColumn('varchar', { length: 36 }) id: string;
  @Column('varchar', { length: 32 }) lane: string;
  @Column('varchar', { length: 36 }) subjectId: string;
  @Column('text') payloadJson: string;
  @Column('varchar', { length: 16 }) state: JobState;

  /** Attempts started so far (a start counts even when the server dies during it). */
  @Column('integer', { default: 0 }) attempts: number;
  @Column('integer', { default: 3 }) maxAttempts: number;
  @Column('integer', { default: 0 }) progressPercent: number;
  @Column('text', { nullable: true }) error: string | null;

  /** Not claimed before this time (ISO 8601); a released job waits here. */
  @Column('varchar', { length: 30 }) runAfter: string;
  @Column('varchar', { length: 30 }) createdAt: string;
  @Column('varchar', { length: 30, nullable: true }) startedAt: string | null;
  @Column('varchar', { length: 30, nullable: true }) finishedAt: string | null;
}
