import { Module } from '@nestjs/common';
import { RecordingsModule } from '../recordings/recordings.module';
import { ScheduleModule } from '../schedule/schedule.module';
import { StudiesModule } from '../studies/studies.module';
import { VisitsModule } from '../visits/visits.module';
import { BulkUploadReceiver } from './bulk-upload-receiver';
import { BulkUploadsController } from './bulk-uploads.controller';
import { BulkUploadsService } from './bulk-uploads.service';

/**
 * Bulk upload with a CSV manifest: checks every row, then imports all or nothing. Recordings
 * are still written by the recordings module (its bulk entry points); this module decides.
 */
@Module({
  imports: [RecordingsModule, ScheduleModule, StudiesModule, VisitsModule],
  controllers: [BulkUploadsController],
  providers: [BulkUploadsService, BulkUploadReceiver],
})
export class BulkUploadsModule {}
