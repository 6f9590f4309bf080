import { Module } from '@nestjs/common';
import { FlagsModule } from '../flags/flags.module';
import { VisitsModule } from '../visits/visits.module';
import { BlindedDecisionsController } from './blinded-decisions.controller';
import { BlindedDecisionsService } from './blinded-decisions.service';
import { BlindingModule } from './blinding.module';

/** Review's side of blinded review: a visit's blinding state and the analyst's decision. */
@Module({
  imports: [BlindingModule, FlagsModule, VisitsModule],
  controllers: [BlindedDecisionsController],
  providers: [BlindedDecisionsService],
})
export class BlindedDecisionsModule {}
