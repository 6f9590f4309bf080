import { Module } from '@nestjs/common';
import { AnalysisResultsController } from './analysis-results.controller';
import { AnalysisRunsService } from './analysis-runs.service';
import { AnalysisSettingsController } from './analysis-settings.controller';
import { AnalysisSettingsService } from './analysis-settings.service';

@Module({
  controllers: [AnalysisSettingsController, AnalysisResultsController],
  providers: [AnalysisSettingsService, AnalysisRunsService],
  exports: [AnalysisSettingsService, AnalysisRunsService],
})
export class AnalysisModule {}
