import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { StudiesModule } from '../studies/studies.module';
import { PlannedVisit } from './planned-visit.entity';
import { PlannedVisitsService } from './planned-visits.service';
import { ScheduleController } from './schedule.controller';
import { StudyGroup } from './study-group.entity';
import { StudyGroupsService } from './study-groups.service';

/** A study's visit schedule (planned visits) and its groups or arms. */
@Module({
  imports: [TypeOrmModule.forFeature([PlannedVisit, StudyGroup]), StudiesModule],
  controllers: [ScheduleController],
  providers: [PlannedVisitsService, StudyGroupsService],
  exports: [PlannedVisitsService, StudyGroupsService],
})
export class ScheduleModule {}
