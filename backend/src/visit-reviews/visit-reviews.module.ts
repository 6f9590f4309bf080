import { Module } from '@nestjs/common';
import { BlindingModule } from '../blinding/blinding.module';
import { RecordingsModule } from '../recordings/recordings.module';
import { VisitsModule } from '../visits/visits.module';
import { VisitReviewsController } from './visit-reviews.controller';
import { VisitReviewsService } from './visit-reviews.service';

@Module({
  imports: [RecordingsModule, VisitsModule, BlindingModule],
  controllers: [VisitReviewsController],
  providers: [VisitReviewsService],
  exports: [VisitReviewsService],
})
export class VisitReviewsModule {}
