import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { RecordingsModule } from '../recordings/recordings.module';
import { ScheduleModule } from '../schedule/schedule.module';
import { SitesModule } from '../sites/sites.module';
import { StudiesModule } from '../studies/studies.module';
import { VisitsModule } from '../visits/visits.module';
import { BidsImportController } from './bids-import.controller';
import { BidsImportReceiver } from './bids-import-receiver';
import { BidsImportService } from './bids-import.service';

/**
 * EEG-BIDS import: a BIDS session folder or zip mapped to participants and planned visits,
 * previewed, then imported all or nothing. Recordings are still written by the recordings
 * module (its bulk entry points); this module maps, checks and decides.
 */
@Module({
  imports: [
    AnalysisModule,
    RecordingsModule,
    ScheduleModule,
    SitesModule,
    StudiesModule,
    VisitsModule,
  ],
  controllers: [BidsImportController],
  providers: [BidsImportService, BidsImportReceiver],
})
export class BidsImportModule {}
