import { Module } from '@nestjs/common';
import { BlindingModule } from '../blinding/blinding.module';
import { FlagsModule } from '../flags/flags.module';
import { VisitReviewsModule } from '../visit-reviews/visit-reviews.module';
import { WorklistController } from './worklist.controller';
import { WorklistService } from './worklist.service';
import { WorklistSources } from './worklist-sources';

@Module({
  imports: [FlagsModule, VisitReviewsModule, BlindingModule],
  controllers: [WorklistController],
  providers: [WorklistService, WorklistSources],
})
export class WorklistModule {}
