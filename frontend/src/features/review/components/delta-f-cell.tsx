import { Table, Typography } from 'antd';
import type { TableProps } from 'antd';
import { formatDeltaHz, formatDeltaHzRange } from '../../../lib/format';

/**
 * Δf cells and tables of the Conditions and cross-check cards.
 *
 * A Δf over its 95 % interval, one above the other: two numbers in one narrow column, so the
 * review tables keep every column on a phone's width.
 */
export function DeltaFWithCi({
  deltaFHz,
  ciHz,
  strong = false,
}: {
  deltaFHz: number | null;
  ciHz: readonly [number, number] | null;
  strong?: boolean;
}) {
  return (
    <>
      <Typography.Text strong={strong} className="gyre-block gyre-nowrap">
        {formatDeltaHz(deltaFHz)}
      </Typography.Text>
      <Typography.Text type="secondary" className="gyre-block gyre-review-small">
        {formatDeltaHzRange(ciHz)}
      </Typography.Text>
    </>
  );
}

/** The small, unpaged table of figures the analysis-depth cards use. */
export function FiguresTable<Row extends object>(props: TableProps<Row>) {
  return <Table<Row> size="small" className="gyre-figures" pagination={false} {...props} />;
}
