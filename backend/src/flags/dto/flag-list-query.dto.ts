import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { FLAG_STATES } from '@gyre/shared';
import type { FlagState } from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const FLAG_SORTS = ['raisedAt', 'clearedAt', 'state'] as const;

export class FlagListQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: FLAG_STATES })
  @IsOptional()
  @IsIn(FLAG_STATES)
  state?: FlagState;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(64)
  participantId?: string;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(64)
  siteId?: string;

  @ApiPropertyOptional({ enum: FLAG_SORTS, default: 'raisedAt' })
  @IsOptional()
  @IsIn(FLAG_SORTS)
  sort?: (typeof FLAG_SORTS)[number];
}
