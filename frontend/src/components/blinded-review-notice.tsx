import { Alert } from 'antd';
import { ApiError } from '../lib/api-client';

/** The notice of blinded review, word for word as docs/user-guide.md gives it. */
export const BLINDED_NOTICE =
  'Blinded review: visit details hidden until you record your decision.';

/** Shown on an analyst's worklist and Review while visits are blinded for them. */
export function BlindedReviewNotice({ description }: { description: React.ReactNode }) {
  return (
    <Alert
      role="note"
      aria-label="Blinded review"
      type="info"
      showIcon
      title={BLINDED_NOTICE}
      description={description}
      className="gyre-below"
    />
  );
}

/** The server's codes for what blinded review keeps from an analyst (backend blinding.errors.ts). */
const BLINDED_REFUSALS = new Set([
  'BLINDING_STUDY_CLOSED',
  'BLINDING_PARTICIPANT_BLINDED',
  'BLINDING_VISIT_BLINDED',
]);

/** Whether a failed read was refused because of blinded review (not a fault to retry). */
export function isBlindedRefusal(error: unknown): error is ApiError {
  return error instanceof ApiError && error.status === 403 && BLINDED_REFUSALS.has(error.code);
}

/**
 * In place of a screen blinded review keeps from the analyst: what is closed, why, and what
 * they can do instead. `what` names the screen ("The study overview").
 */
export function BlindedClosedNotice({ what, reason }: { what: string; reason: string }) {
  return (
    <Alert
      role="note"
      aria-label="Closed during blinded review"
      type="info"
      showIcon
      title={`${what} is closed to you while blinded review is on.`}
      description={reason}
      className="gyre-below"
    />
  );
}
