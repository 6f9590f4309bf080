import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { FlagsModule } from '../flags/flags.module';
import { ParticipantsModule } from '../participants/participants.module';
import { VisitsModule } from '../visits/visits.module';
import { TrajectoryController } from './trajectory.controller';
import { TrajectoryService } from './trajectory.service';

@Module({
  imports: [AnalysisModule, FlagsModule, ParticipantsModule, VisitsModule],
  controllers: [TrajectoryController],
  providers: [TrajectoryService],
})
export class TrajectoryModule {}
