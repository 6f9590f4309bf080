import { ApiProperty } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsString, MaxLength, MinLength } from 'class-validator';
import type { FlagChange } from '@gyre/shared';

/** Raising or clearing a flag always takes a written reason of at least 10 characters. */
export class FlagChangeDto implements FlagChange {
  @ApiProperty({
    minLength: 10,
    example: 'Δf −0.4 Hz with CI excluding 0, consistent across channels',
  })
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value))
  @IsString()
  @MinLength(10)
  @MaxLength(2000)
  reason: string;
}
