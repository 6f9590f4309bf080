import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsInt, IsOptional, Max, Min } from 'class-validator';
import {
  REVIEW_SECTIONS,
  UPLOAD_SECTIONS,
  WORKLIST_DEFAULT_LIMIT,
  WORKLIST_MAX_LIMIT,
  WORKLIST_SORTS,
} from '@gyre/shared';
import type { WorklistQuery, WorklistSectionKey, WorklistSort } from '@gyre/shared';
import { OneOf, WholeNumber } from '../../common/dto/query-filters';

export const WORKLIST_SECTION_KEYS: readonly WorklistSectionKey[] = [
  ...new Set<WorklistSectionKey>([...REVIEW_SECTIONS, ...UPLOAD_SECTIONS]),
];

/** `?sort=&limit=&offset=&section=` of `GET /api/worklist`. */
export class WorklistQueryDto implements WorklistQuery {
  @OneOf(WORKLIST_SORTS, { default: 'oldest' })
  sort?: WorklistSort;

  @WholeNumber({ minimum: 1, maximum: WORKLIST_MAX_LIMIT, default: WORKLIST_DEFAULT_LIMIT })
  limit?: number;

  @ApiPropertyOptional({ minimum: 0, default: 0 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  @Max(1_000_000)
  offset?: number;

  @OneOf(WORKLIST_SECTION_KEYS)
  section?: WorklistSectionKey;
}
