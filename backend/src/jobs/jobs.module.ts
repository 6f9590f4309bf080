import { Module } from '@nestjs/common';
import { WorkerPoolService } from './worker-pool.service';

/** The worker threads (validation lane and analysis lane) and the code they run (worker/). */
@Module({
  providers: [WorkerPoolService],
  exports: [WorkerPoolService],
})
export class JobsModule {}
