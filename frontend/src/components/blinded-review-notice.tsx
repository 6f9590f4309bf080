import { Alert } from 'antd';

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
