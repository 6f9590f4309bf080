import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BlindingModule } from '../blinding/blinding.module';
import { ParticipantsModule } from '../participants/participants.module';
import { ScheduleModule } from '../schedule/schedule.module';
import { StudiesModule } from '../studies/studies.module';
import { DueVisitsController } from './due-visits.controller';
import { DueVisitsService } from './due-visits.service';
import { Visit } from './visit.entity';
import { VisitsController } from './visits.controller';
import { VisitsService } from './visits.service';

@Module({
  imports: [
    TypeOrmModule.forFeature([Visit]),
    ParticipantsModule,
    ScheduleModule,
    StudiesModule,
    BlindingModule,
  ],
  controllers: [VisitsController, DueVisitsController],
  providers: [VisitsService, DueVisitsService],
  exports: [VisitsService, ParticipantsModule],
})
export class VisitsModule {}
