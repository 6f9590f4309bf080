import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsIn, IsString, MaxLength, MinLength } from 'class-validator';
import { BLINDED_DECISIONS, type BlindedDecision, type BlindedDecisionChange } from '@gyre/shared';

/** The analyst's decision on a blinded visit, with a written reason as a flag takes. */
export class BlindedDecisionDto implements BlindedDecisionChange {
  @ApiProperty({ enum: BLINDED_DECISIONS, example: 'noFlag' })
  @IsIn(BLINDED_DECISIONS, { message: `decision must be one of ${BLINDED_DECISIONS.join(', ')}` })
  decision: BlindedDecision;

  @ApiProperty({ minLength: 10, example: 'Δf within ±0.1 Hz and the CI includes 0' })
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value))
  @IsString()
  @MinLength(10)
  @MaxLength(2000)
  reason: string;
}
