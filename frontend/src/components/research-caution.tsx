import { Alert } from 'antd';

/** The research-use caution, word for word as docs/user-guide.md gives it. */
export const RESEARCH_CAUTION =
  'Research use only. Not a diagnostic device: do not use these results for clinical decisions. Follow your study protocol, local regulations and licensed clinicians.';

/** Shown on every Review, Participants, Ledger and Reports screen. */
export function ResearchCaution() {
  return (
    <Alert
      role="note"
      aria-label="Research use caution"
      type="warning"
      showIcon
      title={RESEARCH_CAUTION}
      className="gyre-below"
    />
  );
}
