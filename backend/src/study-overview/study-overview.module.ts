import { Module } from '@nestjs/common';
import { StudyOverviewController } from './study-overview.controller';
import { StudyOverviewService } from './study-overview.service';
import { StudyOverviewSources } from './study-overview-sources';

@Module({
  controllers: [StudyOverviewController],
  providers: [StudyOverviewService, StudyOverviewSources],
})
export class StudyOverviewModule {}
