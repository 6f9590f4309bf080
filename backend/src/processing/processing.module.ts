import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { JobsModule } from '../jobs/jobs.module';
import { QueueModule } from '../queue/queue.module';
import { RecordingsModule } from '../recordings/recordings.module';
import { VisitsModule } from '../visits/visits.module';
import { ComputationStepsService } from './computation-steps.service';
import { ComputationsService } from './computations.service';
import { OverrideRerunsListener } from './override-reruns.listener';
import { RemoteComputationsService } from './remote-computations.service';
import { RestFollowListener } from './rest-follow.listener';
import { RunsController } from './runs.controller';
import { RunsService } from './runs.service';

/**
 * Runs computations: takes jobs from the queue's analysis lane into the worker pool (or, with
 * REDIS_URL, hands them to BullMQ for remote workers), stores their runs through analysis/,
 * moves recordings through recordings/, and recomputes what a changed resting IAF or visit
 * override makes out of date.
 */
@Module({
  imports: [QueueModule, JobsModule, RecordingsModule, AnalysisModule, VisitsModule],
  controllers: [RunsController],
  providers: [
    ComputationsService,
    ComputationStepsService,
    RemoteComputationsService,
    RunsService,
    RestFollowListener,
    OverrideRerunsListener,
  ],
  exports: [ComputationsService, ComputationStepsService, RemoteComputationsService],
})
export class ProcessingModule {}
