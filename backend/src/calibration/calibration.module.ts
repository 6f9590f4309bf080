import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { JobsModule } from '../jobs/jobs.module';
import { ProcessingModule } from '../processing/processing.module';
import { QueueModule } from '../queue/queue.module';
import { SitesModule } from '../sites/sites.module';
import { CalibrationComputationsService } from './calibration-computations.service';
import { CalibrationController } from './calibration.controller';
import { CalibrationService } from './calibration.service';
import { CALIBRATION_SIGNAL, DEFAULT_CALIBRATION_SIGNAL } from './calibration-signal';

/**
 * A site's calibration run: Gyre's generated recording with known answers, computed through the
 * job queue and the worker pool with the study's current settings, compared and kept apart
 * from study data. ProcessingModule is imported so that its start-up recovery of the queue runs
 * before this module claims anything.
 */
@Module({
  imports: [QueueModule, JobsModule, SitesModule, AnalysisModule, ProcessingModule],
  controllers: [CalibrationController],
  providers: [
    CalibrationService,
    CalibrationComputationsService,
    { provide: CALIBRATION_SIGNAL, useValue: DEFAULT_CALIBRATION_SIGNAL },
  ],
})
export class CalibrationModule {}
