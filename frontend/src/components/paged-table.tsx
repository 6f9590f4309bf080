import type { Page } from '@gyre/shared';
import { Table, type TableColumnsType, type TableProps } from 'antd';
import type { ReactNode } from 'react';
import { EmptyState, ErrorState, TableSkeleton } from './page-states';
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
  query: { data, error, isLoading, mutate },
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
  if (error !== undefined) {
    return <ErrorState error={error} onRetry={() => void mutate()} title={loadErrorTitle} />;
  }
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
