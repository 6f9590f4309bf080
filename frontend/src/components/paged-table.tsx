import type { Page } from '@gyre/shared';
import { Table, type TableColumnsType, type TableProps } from 'antd';
import type { ReactNode } from 'react';
import { EmptyState, ReadError, TableSkeleton } from './page-states';
import { ScrollRegion } from './scroll-region';

/** What a list hook answers (SWR): one page of rows, its error, and how to ask again. */
export interface PageQuery<Row> {
  data?: Page<Row>;
  error?: unknown;
  isLoading: boolean;
  mutate: () => Promise<unknown>;
}

/**
 * One page of a server-paged list as a table: a failed load with "Try again", a skeleton while
 * the first page loads, `emptyText` when there is nothing, and page links under more than one
 * page. `scrollLabel` puts a wide table in a named, keyboard-scrollable region.
 */
export function PagedTable<Row extends { id: string }>({
  query,
  loadErrorTitle,
  emptyText,
  columns,
  page,
  pageSize,
  onPageChange,
  scrollLabel,
  rowClassName,
}: {
  query: PageQuery<Row>;
  loadErrorTitle: string;
  emptyText: ReactNode;
  columns: TableColumnsType<Row>;
  page: number;
  pageSize: number;
  onPageChange: (page: number) => void;
  scrollLabel?: string;
  rowClassName?: TableProps<Row>['rowClassName'];
}) {
  const { data, error, isLoading } = query;
  if (error !== undefined) return <ReadError read={query} title={loadErrorTitle} />;
  const table = (
    <Table<Row>
      rowKey="id"
      size="middle"
      loading={isLoading && data !== undefined}
      columns={columns}
      {...(scrollLabel === undefined
        ? { scroll: { x: 'max-content' } }
        : { tableLayout: 'auto', className: 'gyre-table-natural-width' })}
      dataSource={data?.items ?? []}
      rowClassName={rowClassName}
      pagination={{
        current: page,
        pageSize,
        total: data?.total ?? 0,
        showSizeChanger: false,
        hideOnSinglePage: true,
        onChange: onPageChange,
      }}
      locale={{
        emptyText: isLoading ? <TableSkeleton /> : <EmptyState description={emptyText} />,
      }}
    />
  );
  return scrollLabel === undefined ? (
    table
  ) : (
    <ScrollRegion label={scrollLabel}>{table}</ScrollRegion>
  );
}
