import { Module } from '@nestjs/common';
import { BlindingService } from './blinding.service';

/**
 * Which visits are blinded for the caller (blinded review). No imports of other feature
 * modules, so that the visits module and the worklist can use it without a cycle.
 */
@Module({
  providers: [BlindingService],
  exports: [BlindingService],
})
export class BlindingModule {}
