import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ParticipantsModule } from '../participants/participants.module';
import { Visit } from './visit.entity';
import { VisitsController } from './visits.controller';
import { VisitsService } from './visits.service';

@Module({
  imports: [TypeOrmModule.forFeature([Visit]), ParticipantsModule],
  controllers: [VisitsController],
  providers: [VisitsService],
  exports: [VisitsService, ParticipantsModule],
})
export class VisitsModule {}
