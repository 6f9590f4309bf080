import { RECORDING_KINDS, RECORDING_STATES } from '@gyre/shared';
import type { RecordingKind, RecordingState } from '@gyre/shared';
import { IdText, OneOf } from '../../common/dto/query-filters';
import { ScopedPageQueryDto } from '../../common/pagination/page-query.dto';

export const RECORDING_SORTS = ['createdAt', 'updatedAt', 'state', 'kind', 'sizeBytes'] as const;

/** `GET /api/recordings`: filters, sort and page, all applied in the query. */
export class RecordingListQueryDto extends ScopedPageQueryDto {
  @IdText() visitId?: string;
  @OneOf(RECORDING_STATES) state?: RecordingState;
  @OneOf(RECORDING_KINDS) kind?: RecordingKind;
  @OneOf(RECORDING_SORTS, { default: 'createdAt' }) sort?: (typeof RECORDING_SORTS)[number];
}
