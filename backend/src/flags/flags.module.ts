import { Module } from '@nestjs/common';
import { AnalysisModule } from '../analysis/analysis.module';
import { BlindingModule } from '../blinding/blinding.module';
import { VisitsModule } from '../visits/visits.module';
import { FlagsController } from './flags.controller';
import { FlagsService } from './flags.service';

@Module({
  imports: [AnalysisModule, VisitsModule, BlindingModule],
  controllers: [FlagsController],
  providers: [FlagsService],
  exports: [FlagsService],
})
export class FlagsModule {}
