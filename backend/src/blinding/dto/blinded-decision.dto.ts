import { ApiProperty } from '@nestjs/swagger';
import { IsIn } from 'class-validator';
import { BLINDED_DECISIONS, type BlindedDecision, type BlindedDecisionChange } from '@gyre/shared';
import { WrittenReasonText } from '../../common/dto/text-fields';

/** The analyst's decision on a blinded visit, with a written reason as a flag takes. */
export class BlindedDecisionDto implements BlindedDecisionChange {
  @ApiProperty({ enum: BLINDED_DECISIONS, example: 'noFlag' })
  @IsIn(BLINDED_DECISIONS, { message: `decision must be one of ${BLINDED_DECISIONS.join(', ')}` })
  decision: BlindedDecision;

  @WrittenReasonText({ example: 'Δf within ±0.1 Hz and the CI includes 0' })
  reason: string;
}
