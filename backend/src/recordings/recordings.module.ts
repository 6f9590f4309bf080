import { Module, OnApplicationBootstrap } from '@nestjs/common';
import { JobsModule } from '../jobs/jobs.module';
import { RecordingsController } from './recordings.controller';
import { RecordingsService } from './recordings.service';

@Module({
  imports: [JobsModule],
  controllers: [RecordingsController],
  providers: [RecordingsService],
})
export class RecordingsModule implements OnApplicationBootstrap {
  constructor(private readonly recordings: RecordingsService) {}

  async onApplicationBootstrap(): Promise<void> {
    await this.recordings.recoverInterruptedUploads();
  }
}
