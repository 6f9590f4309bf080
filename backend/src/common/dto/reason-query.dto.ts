import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsString, MaxLength } from 'class-validator';

/** `?reason=` on DELETE routes: kept in the audit entry. */
export class ReasonQueryDto {
  @ApiPropertyOptional({ description: 'Why; kept in the audit trail' })
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  reason?: string;
}
