import { REVISION_STATES } from '@gyre/shared';
import type { RevisionState } from '@gyre/shared';
import { IdText, OneOf } from '../../common/dto/query-filters';
import { ScopedPageQueryDto } from '../../common/pagination/page-query.dto';

export const REVISION_SORTS = ['signedAt', 'revision'] as const;

export class RevisionListQueryDto extends ScopedPageQueryDto {
  @OneOf(REVISION_STATES) state?: RevisionState;
  @IdText() visitId?: string;
  @IdText() reportId?: string;
  @OneOf(REVISION_SORTS, { default: 'signedAt' }) sort?: (typeof REVISION_SORTS)[number];
}
