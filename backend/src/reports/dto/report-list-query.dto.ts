import { REPORT_STATES } from '@gyre/shared';
import type { ReportState } from '@gyre/shared';
import { OneOf } from '../../common/dto/query-filters';
import { ScopedPageQueryDto } from '../../common/pagination/page-query.dto';

export const REPORT_SORTS = ['createdAt', 'updatedAt', 'state'] as const;

export class ReportListQueryDto extends ScopedPageQueryDto {
  @OneOf(REPORT_STATES) state?: ReportState;
  @OneOf(REPORT_SORTS, { default: 'createdAt' }) sort?: (typeof REPORT_SORTS)[number];
}
