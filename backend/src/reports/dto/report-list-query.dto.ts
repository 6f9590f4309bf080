import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { REPORT_STATES } from '@gyre/shared';
import type { ReportState } from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const REPORT_SORTS = ['createdAt', 'updatedAt', 'state'] as const;

export class ReportListQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: REPORT_STATES })
  @IsOptional()
  @IsIn(REPORT_STATES)
  state?: ReportState;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(64)
  siteId?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(64)
  participantId?: string;

  @ApiPropertyOptional({ enum: REPORT_SORTS, default: 'createdAt' })
  @IsOptional()
  @IsIn(REPORT_SORTS)
  sort?: (typeof REPORT_SORTS)[number];
}
