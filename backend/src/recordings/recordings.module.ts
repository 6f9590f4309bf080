import { Module, OnApplicationBootstrap } from '@nestjs/common';
import { BlindingModule } from '../blinding/blinding.module';
import { JobsModule } from '../jobs/jobs.module';
import { QueueModule } from '../queue/queue.module';
import { VisitsModule } from '../visits/visits.module';
import { RecordingEventsService } from './recording-events.service';
import { RecordingLifecycle } from './recording-lifecycle';
import { RecordingsController } from './recordings.controller';
import { RecordingsService } from './recordings.service';
import { UploadReceiver } from './upload/upload-receiver';

/** Owns recordings: uploads, their state machine, their files and what the API shows of them. */
@Module({
  imports: [JobsModule, QueueModule, VisitsModule, BlindingModule],
  controllers: [RecordingsController],
  providers: [RecordingsService, RecordingLifecycle, RecordingEventsService, UploadReceiver],
  exports: [RecordingsService],
})
export class RecordingsModule implements OnApplicationBootstrap {
  constructor(
    private readonly recordings: RecordingsService,
    private readonly uploads: UploadReceiver,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    await this.recordings.recoverInterruptedUploads(this.uploads.tempDir);
  }
}
