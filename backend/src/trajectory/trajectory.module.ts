import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { BlindingModule } from '../blinding/blinding.module';
import { TrajectoryInputs } from './trajectory-inputs';
import { TrajectoryController } from './trajectory.controller';
import { TrajectoryService } from './trajectory.service';

@Module({
  imports: [AnalysisModule, BlindingModule],
  controllers: [TrajectoryController],
  providers: [TrajectoryService, TrajectoryInputs],
})
export class TrajectoryModule {}
