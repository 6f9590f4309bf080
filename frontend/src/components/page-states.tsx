import { Button, Card, Empty, Result, Skeleton } from 'antd';
import { Link } from 'react-router-dom';
import { paths } from '../app/paths';
import { ApiError } from '../lib/api-client';
import { LostIcon } from './state-icons';

/** The grey outline of a screen while its data loads. */
export function LoadingState({ rows = 6, label = 'Loading' }: { rows?: number; label?: string }) {
  return (
    <Card aria-busy="true" aria-label={label}>
      <Skeleton active title paragraph={{ rows }} />
    </Card>
  );
}

/** A read as SWR answers it, for `pendingState` and `ReadError`. */
interface PendingRead {
  data?: unknown;
  error?: unknown;
  mutate: () => Promise<unknown>;
}

/** The failure of `read` under `title`; "Try again" (where it can help) asks once more. */
export function ReadError({ read, title }: { read: PendingRead; title: string }) {
  return <ErrorState title={title} error={read.error} onRetry={() => void read.mutate()} />;
}

/**
 * What a screen shows in place of a read that has not arrived: its failure (with "Try again"
 * where that can help) or its outline; null once the data is there.
 */
export function pendingState(
  read: PendingRead,
  { errorTitle, loadingLabel, rows }: { errorTitle: string; loadingLabel: string; rows?: number },
): React.ReactNode {
  if (read.error !== undefined) return <ReadError read={read} title={errorTitle} />;
  if (read.data === undefined) return <LoadingState label={loadingLabel} rows={rows} />;
  return null;
}

/** Grey rows inside a table while its first page loads (instead of "nothing here"). */
export function TableSkeleton() {
  return (
    <div aria-busy="true" aria-label="Loading" style={{ padding: '8px 0', textAlign: 'left' }}>
      <Skeleton active title={false} paragraph={{ rows: 4 }} />
    </div>
  );
}

/**
 * Whether asking again may help: the server was not reached, timed out, was too busy or
 * failed itself (network, 408, 429, 5xx). A 4xx answer says what is wrong with the request —
 * not found, not allowed, bad input — and the same request would get the same answer.
 */
export function isRetryable(error: unknown): boolean {
  if (!(error instanceof ApiError)) return true;
  return error.status === 0 || error.status === 408 || error.status === 429 || error.status >= 500;
}

/** A 404: the thing does not exist, or it is outside the user's scope (Gyre does not say which). */
export function isNotFound(error: unknown): boolean {
  return error instanceof ApiError && error.status === 404;
}

/** Where a not-found state leads back to. */
export interface WayBack {
  to: string;
  label: string;
}

/**
 * A failed load in plain words. "Try again" only when trying again can help (isRetryable);
 * with `notFoundTitle`, a 404 says the thing does not exist or cannot be opened and offers a
 * way back instead.
 */
export function ErrorState({
  error,
  onRetry,
  title = 'This could not be loaded',
  notFoundTitle,
  back = { to: paths.home, label: 'Back to the start' },
}: {
  error: unknown;
  onRetry?: () => void;
  title?: string;
  /**
   * For a screen's own subject (a visit, a participant): on 404, this title and the way back
   * replace the error. Parts of a screen leave it out and show `title` without a retry.
   */
  notFoundTitle?: string;
  /** The way back offered with `notFoundTitle` (default: the start page). */
  back?: WayBack;
}) {
  if (isNotFound(error) && notFoundTitle !== undefined) {
    return (
      <Result
        icon={<LostIcon />}
        title={notFoundTitle}
        subTitle="It may have been mistyped in the address, or it belongs to a study or site outside your role."
        extra={
          <Link to={back.to}>
            <Button type="primary">{back.label}</Button>
          </Link>
        }
      />
    );
  }
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
        onRetry !== undefined &&
        isRetryable(error) && (
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
