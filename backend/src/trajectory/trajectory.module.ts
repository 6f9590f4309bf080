import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { TrajectoryInputs } from './trajectory-inputs';
import { TrajectoryController } from './trajectory.controller';
import { TrajectoryService } from './trajectory.service';

@Module({
  imports: [AnalysisModule],
  controllers: [TrajectoryController],
  providers: [TrajectoryService, TrajectoryInputs],
})
export class TrajectoryModule {}
