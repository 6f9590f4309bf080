import { Inject, MiddlewareConsumer, Module, NestModule, RequestMethod } from '@nestjs/common';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { ProcessingModule } from '../processing/processing.module';
import { QueueModule } from '../queue/queue.module';
import { RecordingsModule } from '../recordings/recordings.module';
import { resultBodyParser } from './result-body-parser';
import { WorkerJobsController } from './worker-jobs.controller';
import { WorkerJobsService } from './worker-jobs.service';

/**
 * The worker API for `npm run worker` processes (with REDIS_URL; see docs/scale-out.md): job
 * inputs and stored files out, progress, results and failures in, for worker tokens only.
 * The worker process itself is worker-cli.ts; it shares remote-job.ts with the server.
 */
@Module({
  imports: [ProcessingModule, QueueModule, RecordingsModule],
  controllers: [WorkerJobsController],
  providers: [WorkerJobsService],
})
export class RemoteWorkersModule implements NestModule {
  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  configure(consumer: MiddlewareConsumer): void {
    consumer
      .apply(resultBodyParser(this.config.workerResultMaxBytes))
      .forRoutes({ path: 'worker/jobs/:jobId/:attempt/result', method: RequestMethod.POST });
  }
}
