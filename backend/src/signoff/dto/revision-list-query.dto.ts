import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { REVISION_STATES } from '@gyre/shared';
import type { RevisionState } from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const REVISION_SORTS = ['signedAt', 'revision'] as const;

export class RevisionListQueryDto extends PageQueryDto {
  @ApiPropertyOptional({ enum: REVISION_STATES })
  @IsOptional()
  @IsIn(REVISION_STATES)
  state?: RevisionState;

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(64)
  visitId?: string;

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

  @ApiPropertyOptional()
  @IsOptional()
  @IsString()
  @MaxLength(64)
  reportId?: string;

  @ApiPropertyOptional({ enum: REVISION_SORTS, default: 'signedAt' })
  @IsOptional()
  @IsIn(REVISION_SORTS)
  sort?: (typeof REVISION_SORTS)[number];
}
