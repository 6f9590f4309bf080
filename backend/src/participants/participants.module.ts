import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BlindingModule } from '../blinding/blinding.module';
import { ScheduleModule } from '../schedule/schedule.module';
import { SitesModule } from '../sites/sites.module';
import { Participant } from './participant.entity';
import { ParticipantListExtras } from './participant-list-extras';
import { ParticipantsController } from './participants.controller';
import { ParticipantsService } from './participants.service';

@Module({
  imports: [TypeOrmModule.forFeature([Participant]), SitesModule, ScheduleModule, BlindingModule],
  controllers: [ParticipantsController],
  providers: [ParticipantsService, ParticipantListExtras],
  exports: [ParticipantsService],
})
export class ParticipantsModule {}
