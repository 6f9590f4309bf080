import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsUUID, Matches } from 'class-validator';
import { CALENDAR_DATE_PATTERN } from '@gyre/shared';

export class DueQueryDto {
  @ApiPropertyOptional({ description: 'The day to compute for, YYYY-MM-DD (default: today, UTC)' })
  @IsOptional()
  @Matches(CALENDAR_DATE_PATTERN, { message: 'asOf must be a calendar date written YYYY-MM-DD' })
  asOf?: string;

  @ApiPropertyOptional({ description: 'Only this site (inside your scope)' })
  @IsOptional()
  @IsUUID()
  siteId?: string;
}
