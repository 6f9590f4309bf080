import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { BlindingModule } from '../blinding/blinding.module';
import { FlagsModule } from '../flags/flags.module';
import { RecordingsModule } from '../recordings/recordings.module';
import { ScheduleModule } from '../schedule/schedule.module';
import { StudiesModule } from '../studies/studies.module';
import { StudyExportSources } from './study-export-sources';
import { StudyExportsController } from './study-exports.controller';
import { StudyExportsService } from './study-exports.service';

/** Results exports for statisticians: results.csv with its dictionary, and export.zip (BIDS). */
@Module({
  imports: [
    AnalysisModule,
    BlindingModule,
    FlagsModule,
    RecordingsModule,
    ScheduleModule,
    StudiesModule,
  ],
  controllers: [StudyExportsController],
  providers: [StudyExportsService, StudyExportSources],
})
export class StudyExportsModule {}
