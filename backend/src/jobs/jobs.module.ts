import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { ReportsModule } from '../reports/reports.module';
import { JobsService } from './jobs.service';
import { RecordingEventsService } from './recording-events.service';
import { RunsController } from './runs.controller';
import { RunsService } from './runs.service';
import { WorkerPoolService } from './worker-pool.service';

@Module({
  imports: [AnalysisModule, ReportsModule],
  controllers: [RunsController],
  providers: [JobsService, RunsService, WorkerPoolService, RecordingEventsService],
  exports: [JobsService, WorkerPoolService, RecordingEventsService],
})
export class JobsModule {}
