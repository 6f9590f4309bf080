import type { VisitBlindingView } from '@gyre/shared';
import { Tag } from 'antd';
import { BlindedReviewNotice } from '../../../components/blinded-review-notice';
import { PageHeader } from '../../../components/page-header';

/**
 * Review's heading for a visit blinded for the analyst: its code in place of the participant,
 * visit name and date, no link to the participant's other visits, and the notice.
 */
export function BlindedReviewHeader({ blinding }: { blinding: VisitBlindingView }) {
  return (
    <>
      <PageHeader
        title={`Review · visit ${blinding.code ?? ''}`}
        description={<Tag>Blinded</Tag>}
      />
      <BlindedReviewNotice description="You see this visit under its code only: no date, planned visit, group or participant. Judge the results, then record a flag or “no flag” with a reason; the details then appear, for you alone. Upload, computation, flag and review times are given as time after the visit's first upload, such as “+12 min after first upload”, so they give no date away." />
    </>
  );
}
