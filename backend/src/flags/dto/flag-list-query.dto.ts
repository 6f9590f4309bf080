import { FLAG_STATES } from '@gyre/shared';
import type { FlagState } from '@gyre/shared';
import { OneOf } from '../../common/dto/query-filters';
import { ScopedPageQueryDto } from '../../common/pagination/page-query.dto';

export const FLAG_SORTS = ['raisedAt', 'clearedAt', 'state'] as const;

export class FlagListQueryDto extends ScopedPageQueryDto {
  @OneOf(FLAG_STATES) state?: FlagState;
  @OneOf(FLAG_SORTS, { default: 'raisedAt' }) sort?: (typeof FLAG_SORTS)[number];
}
