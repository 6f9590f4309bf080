import type { RecordingRejection } from '@gyre/shared';
import { Typography } from 'antd';

/** The reader's message as it gave it, then the field, what was found and what was expected. */
export function RejectionText({ rejection }: { rejection: RecordingRejection }) {
  const parts = [
    rejection.field !== null ? `Field: ${rejection.field}` : null,
    rejection.found !== null ? `found ${rejection.found}` : null,
    rejection.expected !== null ? `expected ${rejection.expected}` : null,
  ].filter((part): part is string => part !== null);
  return (
    <>
      <Typography.Text>{rejection.message}</Typography.Text>
      {parts.length > 0 && (
        <>
          <br />
          <Typography.Text type="secondary" style={{ fontSize: 12 }}>
            {parts.join(' · ')}
          </Typography.Text>
        </>
      )}
    </>
  );
}

/** Reads a rejection out of an upload error's details, when the server put one there. */
export function rejectionFromDetails(
  details: Record<string, unknown> | null,
  fallbackMessage: string,
): RecordingRejection {
  const text = (name: string): string | null => {
    const value = details?.[name];
    return typeof value === 'string' ? value : null;
  };
  return {
    message: text('message') ?? fallbackMessage,
    field: text('field'),
    found: text('found'),
    expected: text('expected'),
  };
}
