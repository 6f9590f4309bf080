import { IdText, OneOf, WholeNumber } from '../dto/query-filters';

export const MAX_PAGE_SIZE = 200;
/** The last page whose offset, (page − 1) × pageSize, is still a safe integer for SQLite. */
export const MAX_PAGE = Math.floor(Number.MAX_SAFE_INTEGER / MAX_PAGE_SIZE);

/** `?page=&pageSize=&order=`; each list adds its own `sort` with the columns it allows. */
export class PageQueryDto {
  @WholeNumber({ minimum: 1, maximum: MAX_PAGE, default: 1 })
  page?: number;

  @WholeNumber({ minimum: 1, maximum: MAX_PAGE_SIZE, default: 20 })
  pageSize?: number;

  @OneOf(['asc', 'desc'], { default: 'asc' })
  order?: 'asc' | 'desc';
}

/** A page of a list that study members see by participant and site (their scope's rows). */
export class ScopedPageQueryDto extends PageQueryDto {
  @IdText() participantId?: string;
  @IdText() siteId?: string;
}

export interface PageWindow {
  page: number;
  pageSize: number;
  skip: number;
  take: number;
  order: 'ASC' | 'DESC';
}

/**
 * The find options of one page: sorted by `column` in the window's order, then by id (`idOrder`,
 * ascending unless a list says otherwise) so that rows with equal values keep one order and no
 * row shows on two pages.
 */
export function pageSliceOf(
  window: PageWindow,
  column: string,
  idOrder: 'ASC' | 'DESC' = 'ASC',
): { order: Record<string, 'ASC' | 'DESC'>; skip: number; take: number } {
  return { order: { [column]: window.order, id: idOrder }, skip: window.skip, take: window.take };
}

export function pageWindowOf(
  query: PageQueryDto,
  defaultOrder: 'asc' | 'desc' = 'asc',
): PageWindow {
  const page = query.page ?? 1;
  const pageSize = query.pageSize ?? 20;
  return {
    page,
    pageSize,
    skip: (page - 1) * pageSize,
    take: pageSize,
    order: (query.order ?? defaultOrder) === 'asc' ? 'ASC' : 'DESC',
  };
}
