import { Can } from '@casl/react';
import type { AppAbility, VisitReviewStateView } from '@gyre/shared';
import { Alert, Button, Flex, Tag, Typography } from 'antd';

import { useSubmission } from '../../../lib/use-submission';
import { GYRE_COLORS } from '../../../app/theme';
import { useVisitTime } from './visit-time';

/**
 * The "visit reviewed" act: who reviewed the visit's results and when, whether they have
 * changed since, and (for analysts only) the button that records the review of the results
 * on screen. `onMark` sends the fingerprint of those results.
 */
export function ReviewMark({
  state,
  meId,
  onMark,
}: {
  state: VisitReviewStateView;
  meId: string;
  onMark: (fingerprint: string) => Promise<void>;
}) {
  const formatTime = useVisitTime();
  const {
    busy: saving,
    error: failure,
    run,
  } = useSubmission('The visit could not be marked reviewed.');
  const latest = state.latest;
  const who = latest === null ? '' : latest.reviewedById === meId ? 'you' : latest.reviewedByName;
  return (
    <Flex vertical gap={10}>
      {latest === null ? (
        <Typography.Text>No one has marked this visit reviewed yet.</Typography.Text>
      ) : state.reviewed ? (
        <div>
          <Tag color={GYRE_COLORS.primary}>Reviewed</Tag>
          by {who}, {formatTime(latest.reviewedAt)}
        </div>
      ) : (
        <Alert
          type="warning"
          showIcon
          title="Results changed since review"
          description={`Reviewed by ${who}, ${formatTime(latest.reviewedAt)}; the visit's results have changed since, so it waits for review again.`}
        />
      )}
      <Can<AppAbility> I="create" a="VisitReview">
        {state.canReview && state.currentFingerprint !== null ? (
          <Button
            type="primary"
            loading={saving}
            onClick={() => run(() => onMark(state.currentFingerprint ?? ''))}
          >
            Mark reviewed
          </Button>
        ) : (
          state.cannotReviewReason !== null &&
          !state.reviewed && (
            <Typography.Text type="secondary">{state.cannotReviewReason}</Typography.Text>
          )
        )}
      </Can>
      {failure !== null && <Alert type="error" showIcon title={failure} />}
    </Flex>
  );
}
