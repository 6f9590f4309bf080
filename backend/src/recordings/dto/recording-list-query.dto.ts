import { ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsOptional, IsString, MaxLength } from 'class-validator';
import { RECORDING_KINDS, RECORDING_STATES } from '@gyre/shared';
import type { RecordingKind, RecordingState } from '@gyre/shared';
import { PageQueryDto } from '../../common/pagination/page-query.dto';

export const RECORDING_SORTS = ['createdAt', 'updatedAt', 'state', 'kind', 'sizeBytes'] as const;

/** `GET /api/recordings`: filters, sort and page, all applied in the query. */
export class RecordingListQueryDto extends PageQueryDto {
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

  @ApiPropertyOptional({ enum: RECORDING_STATES })
  @IsOptional()
  @IsIn(RECORDING_STATES)
  state?: RecordingState;

  @ApiPropertyOptional({ enum: RECORDING_KINDS })
  @IsOptional()
  @IsIn(RECORDING_KINDS)
  kind?: RecordingKind;

  @ApiPropertyOptional({ enum: RECORDING_SORTS, default: 'createdAt' })
  @IsOptional()
  @IsIn(RECORDING_SORTS)
  sort?: (typeof RECORDING_SORTS)[number];
}
