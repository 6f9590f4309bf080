import type { TableColumnsType } from 'antd';
import type { ReactNode } from 'react';

/** A right-aligned, sortable column of a number a row may lack (missing sorts after numbers). */
export function numberColumn<Row>(
  title: string,
  key: string,
  pick: (row: Row) => number | null,
  text: (row: Row) => ReactNode,
  defaultSortOrder?: 'ascend',
): TableColumnsType<Row>[number] {
  return {
    title,
    key,
    align: 'right',
    sorter: byNumber(pick),
    defaultSortOrder,
    render: (_, row) => text(row),
  };
}

/** Compares two rows by a number; a row without one compares as larger. */
function byNumber<Row>(pick: (row: Row) => number | null) {
  return (a: Row, b: Row) => {
    const x = pick(a);
    const y = pick(b);
    if (x === null && y === null) return 0;
    if (x === null) return 1;
    if (y === null) return -1;
    return x - y;
  };
}
