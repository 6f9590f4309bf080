import { Module } from '@nestjs/common';
import { BlindingModule } from '../blinding/blinding.module';
import { StudyOverviewController } from './study-overview.controller';
import { StudyOverviewService } from './study-overview.service';
import { StudyOverviewSources } from './study-overview-sources';

@Module({
  imports: [BlindingModule],
  controllers: [StudyOverviewController],
  providers: [StudyOverviewService, StudyOverviewSources],
})
export class StudyOverviewModule {}
