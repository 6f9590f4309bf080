import { Card, Skeleton } from 'antd';
import { ReadError } from '../../../components/page-states';

/** Card titles wrap at phone width instead of being cut with an ellipsis. */
const WRAPPING_TITLE = { title: { whiteSpace: 'normal', overflowWrap: 'anywhere' } } as const;

/** One of Review's cards, named for assistive technology by `label`. */
export function ReviewCard({
  title,
  label,
  children,
}: {
  title: string;
  label: string;
  children: React.ReactNode;
}) {
  return (
    <Card styles={WRAPPING_TITLE} title={title} aria-label={label}>
      {children}
    </Card>
  );
}

/** An SWR read as a card needs it. */
interface Read<T> {
  data?: T;
  error?: unknown;
  mutate: () => Promise<unknown>;
}

/**
 * A Review card whose body is one read: why it failed (with a retry), a skeleton of `rows`
 * lines while it loads, then `children` of its data.
 */
export function LoadedCard<T>({
  title,
  label,
  read,
  failed,
  rows,
  children,
}: {
  title: string;
  label: string;
  read: Read<T>;
  /** What could not be loaded, e.g. "The flag could not be loaded". */
  failed: string;
  rows?: number;
  children: (data: T) => React.ReactNode;
}) {
  return (
    <ReviewCard title={title} label={label}>
      {read.error !== undefined ? (
        <ReadError read={read} title={failed} />
      ) : read.data === undefined ? (
        <Skeleton active paragraph={rows === undefined ? undefined : { rows }} />
      ) : (
        children(read.data)
      )}
    </ReviewCard>
  );
}
