import type { RecordingRejection } from '@gyre/shared';
import { Typography } from 'antd';
import { rejectionAdvice } from './rejection-advice';
import '../intake.css';

/**
 * Why a file was refused, in plain words with what to do, then the server's exact words: its
 * message and the field, what was found and what was expected.
 */
export function RejectionText({
  rejection,
  sizeBytes = null,
}: {
  rejection: RecordingRejection;
  /** The uploaded file's size, to say how long it should have been. */
  sizeBytes?: number | null;
}) {
  const advice = rejectionAdvice(rejection, sizeBytes);
  const parts = [
    rejection.field !== null ? `Field: ${rejection.field}` : null,
    rejection.found !== null ? `found ${rejection.found}` : null,
    rejection.expected !== null ? `expected ${rejection.expected}` : null,
  ].filter((part): part is string => part !== null);
  return (
    <>
      <Typography.Text>{advice.problem}</Typography.Text>{' '}
      <Typography.Text strong className="gyre-inherit-colour">
        {advice.action}
      </Typography.Text>
      <details className="gyre-check-details">
        <summary>
          <Typography.Text type="secondary" className="gyre-caption">
            Details from the file check
          </Typography.Text>
        </summary>
        <Typography.Text type="secondary" className="gyre-caption gyre-wrap-anywhere">
          {rejection.message}
          {parts.length > 0 && (
            <>
              <br />
              {parts.join(' · ')}
            </>
          )}
        </Typography.Text>
      </details>
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
