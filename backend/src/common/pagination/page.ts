import { Page } from '@gyre/shared';
import { PageWindow } from './page-query.dto';

export function toPage<E, V>(
  [rows, total]: [E[], number],
  window: PageWindow,
  view: (row: E) => V,
): Page<V> {
  return { items: rows.map(view), total, page: window.page, pageSize: window.pageSize };
}
