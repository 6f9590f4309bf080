import { Module } from '@nestjs/common';
import { JOB_QUEUE } from './job-queue';
import { SqliteJobQueue } from './sqlite-job-queue';

/** The job queue: the embedded SQLite table (the only implementation so far). */
@Module({
  providers: [SqliteJobQueue, { provide: JOB_QUEUE, useExisting: SqliteJobQueue }],
  exports: [JOB_QUEUE],
})
export class QueueModule {}
