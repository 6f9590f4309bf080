import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, Max, Min } from 'class-validator';
import {
  REVIEW_SECTIONS,
  UPLOAD_SECTIONS,
  WORKLIST_DEFAULT_LIMIT,
  WORKLIST_MAX_LIMIT,
  WORKLIST_SORTS,
} from '@gyre/shared';
import type { WorklistQuery, WorklistSectionKey, WorklistSort } from '@gyre/shared';

export const WORKLIST_SECTION_KEYS: readonly WorklistSectionKey[] = [
  ...new Set<WorklistSectionKey>([...REVIEW_SECTIONS, ...UPLOAD_SECTIONS]),
];

/** `?sort=&limit=&offset=&section=` of `GET /api/worklist`. */
export class WorklistQueryDto implements WorklistQuery {
  @ApiPropertyOptional({ enum: WORKLIST_SORTS, default: 'oldest' })
  @IsOptional()
  @IsIn(WORKLIST_SORTS)
  sort?: WorklistSort;

  @ApiPropertyOptional({ minimum: 1, maximum: WORKLIST_MAX_LIMIT, default: WORKLIST_DEFAULT_LIMIT })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(WORKLIST_MAX_LIMIT)
  limit?: number;

  @ApiPropertyOptional({ minimum: 0, default: 0 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  @Max(1_000_000)
  offset?: number;

  @ApiPropertyOptional({ enum: WORKLIST_SECTION_KEYS })
  @IsOptional()
  @IsIn(WORKLIST_SECTION_KEYS)
  section?: WorklistSectionKey;
}
