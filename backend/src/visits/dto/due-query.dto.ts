import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsOptional, IsUUID } from 'class-validator';
import { CalendarDateText } from '../../common/dto/text-fields';

export class DueQueryDto {
  @CalendarDateText({
    description: 'The day to compute for, YYYY-MM-DD (default: today, UTC)',
    optional: true,
  })
  asOf?: string;

  @ApiPropertyOptional({ description: 'Only this site (inside your scope)' })
  @IsOptional()
  @IsUUID()
  siteId?: string;
}
