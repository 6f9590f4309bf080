import { Button, Card, Empty, Result, Skeleton } from 'antd';
import { ApiError } from '../lib/api-client';

/** The grey outline of a screen while its data loads. */
export function LoadingState({ rows = 6, label = 'Loading' }: { rows?: number; label?: string }) {
  return (
    <Card aria-busy="true" aria-label={label}>
      <Skeleton active title paragraph={{ rows }} />
    </Card>
  );
}

/** Grey rows inside a table while its first page loads (instead of "nothing here"). */
export function TableSkeleton() {
  return (
    <div aria-busy="true" aria-label="Loading" style={{ padding: '8px 0', textAlign: 'left' }}>
      <Skeleton active title={false} paragraph={{ rows: 4 }} />
    </div>
  );
}

/** A failed load in plain words, with the way to try again. */
export function ErrorState({
  error,
  onRetry,
  title = 'This could not be loaded',
}: {
  error: unknown;
  onRetry?: () => void;
  title?: string;
}) {
  const message =
    error instanceof ApiError
      ? error.message
      : 'Something went wrong. Try again, and tell your administrator if it keeps happening.';
  return (
    <Result
      status="warning"
      title={title}
      subTitle={<span role="alert">{message}</span>}
      extra={
        onRetry && (
          <Button type="primary" onClick={onRetry}>
            Try again
          </Button>
        )
      }
    />
  );
}

/** Nothing to show yet, and what would make something appear. */
export function EmptyState({ description }: { description: React.ReactNode }) {
  return <Empty image={Empty.PRESENTED_IMAGE_SIMPLE} description={description} />;
}
