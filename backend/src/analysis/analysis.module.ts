import { Module } from '@nestjs/common';
import { BlindingModule } from '../blinding/blinding.module';
import { RecordingsModule } from '../recordings/recordings.module';
import { StudiesModule } from '../studies/studies.module';
import { VisitsModule } from '../visits/visits.module';
import { AnalysisResultsController } from './analysis-results.controller';
import { AnalysisRunsService } from './analysis-runs.service';
import { AnalysisSettingsController } from './analysis-settings.controller';
import { AnalysisSettingsService } from './analysis-settings.service';
import { ResultsBodyCache } from './results-body-cache';
import { SettingsStaleness } from './settings-staleness';
import { VisitAnalysisOverrideController } from './visit-analysis-override.controller';
import { VisitAnalysisOverridesService } from './visit-analysis-overrides.service';

/** Analysis settings (study versions, visit overrides), runs and their results. */
@Module({
  imports: [RecordingsModule, StudiesModule, VisitsModule, BlindingModule],
  controllers: [
    AnalysisSettingsController,
    AnalysisResultsController,
    VisitAnalysisOverrideController,
  ],
  providers: [
    AnalysisSettingsService,
    AnalysisRunsService,
    VisitAnalysisOverridesService,
    SettingsStaleness,
    // One cache per process, built here so Nest does not try to inject its byte bound.
    { provide: ResultsBodyCache, useFactory: () => new ResultsBodyCache() },
  ],
  exports: [AnalysisSettingsService, AnalysisRunsService, VisitAnalysisOverridesService],
})
export class AnalysisModule {}
