import type { ReportSignOffView } from '@gyre/shared';
import { Tag } from 'antd';
import { useSignOff } from '../api/get-sign-off';
import { GYRE_COLORS } from '../../../app/theme';

export interface ReportStatus {
  /** The words shown on the chip and in the card, e.g. "Revision 2 awaits signing (revision 1 sent)". */
  words: string;
  color: string;
}

/**
 * The one place a report's state is put into words, from the sign-off answer: the report's
 * stored state says what happened to the latest signed revision, while `pendingRevision`
 * says whether a newer draft awaits signing. Review's header chip and its report card both
 * show this, so they cannot disagree.
 */
export function reportStatusOf(signOff: ReportSignOffView): ReportStatus {
  const latest = signOff.revisions[0];
  const pending = signOff.pendingRevision;
  if (latest === undefined) {
    return pending === null
      ? { words: 'Draft, nothing to sign yet', color: 'default' }
      : { words: 'Draft, not signed yet', color: 'default' };
  }
  const done = latest.state === 'sent' ? 'sent' : 'signed';
  if (pending !== null) {
    return {
      words: `Revision ${pending} awaits signing (revision ${latest.revision} ${done})`,
      color: GYRE_COLORS.amberText,
    };
  }
  return latest.state === 'sent'
    ? { words: `Revision ${latest.revision} sent to coordinators`, color: 'success' }
    : { words: `Revision ${latest.revision} signed, not yet sent`, color: GYRE_COLORS.primary };
}

/** The report chip of Review's header; nothing while loading or when the role may not read it. */
export function ReportStatusTag({ visitId }: { visitId: string }) {
  const { data } = useSignOff(visitId);
  if (data === undefined || data === null) return null;
  const status = reportStatusOf(data);
  return (
    <Tag color={status.color} data-testid="report-state-chip" className="gyre-wrapping">
      Report: {status.words}
    </Tag>
  );
}
