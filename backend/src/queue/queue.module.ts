import { Module } from '@nestjs/common';
import { JOB_QUEUE } from './job-queue';
import { SqliteJobQueue } from './sqlite-job-queue';

/**
 * The job queue: the embedded SQLite table, the record of every computation in both modes
 * (with REDIS_URL, processing/ hands the running ones to BullMQ; the table stays the truth).
 */
@Module({
  providers: [SqliteJobQueue, { provide: JOB_QUEUE, useExisting: SqliteJobQueue }],
  exports: [JOB_QUEUE],
})
export class QueueModule {}
