import { Can } from '@casl/react';
import type { AppAbility, VisitReviewStateDto } from '@gyre/shared';
import { Alert, Button, Flex, Tag, Typography } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';

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
  state: VisitReviewStateDto;
  meId: string;
  onMark: (fingerprint: string) => Promise<void>;
}) {
  const [saving, setSaving] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const latest = state.latest;
  const who = latest === null ? '' : latest.reviewedById === meId ? 'you' : latest.reviewedByName;
  return (
    <Flex vertical gap={10}>
      {latest === null ? (
        <Typography.Text>No one has marked this visit reviewed yet.</Typography.Text>
      ) : state.reviewed ? (
        <div>
          <Tag color="#24525A">Reviewed</Tag>
          by {who}, {formatDateTime(latest.reviewedAt)}
        </div>
      ) : (
        <Alert
          type="warning"
          showIcon
          title="Results changed since review"
          description={`Reviewed by ${who}, ${formatDateTime(latest.reviewedAt)}; the visit's results have changed since, so it waits for review again.`}
        />
      )}
      <Can<AppAbility> I="create" a="VisitReview">
        {state.canReview && state.currentFingerprint !== null ? (
          <Button
            type="primary"
            loading={saving}
            onClick={async () => {
              setSaving(true);
              setFailure(null);
              try {
                await onMark(state.currentFingerprint ?? '');
              } catch (error) {
                setFailure(error instanceof ApiError ? error.message : String(error));
              } finally {
                setSaving(false);
              }
            }}
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
