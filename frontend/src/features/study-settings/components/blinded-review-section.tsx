import type { StudyView } from '@gyre/shared';
import { App, Button, Card, Form, Input, Switch, Typography } from 'antd';
import { FormError } from '../../../components/form-error';
import { useSubmission } from '../../../lib/use-submission';
import { useUpdateBlindedReview } from '../api/studies';

const REASON_MIN_LENGTH = 10;

interface BlindedReviewValues {
  blindedReview: boolean;
  reason: string;
}

/**
 * Blinded review, a study setting: while on, analysts see each visit under a code, without its
 * date, planned visit, group or the participant's other visits, until they record their
 * decision. Admins turn it on or off with a reason (kept in the Ledger); others read it.
 */
export function BlindedReviewSection({
  study,
  canManage,
}: {
  study: StudyView;
  canManage: boolean;
}) {
  const update = useUpdateBlindedReview();
  const { message } = App.useApp();
  const { busy, error, run } = useSubmission('Blinded review could not be changed.');
  const [form] = Form.useForm<BlindedReviewValues>();
  const chosen = Form.useWatch('blindedReview', form) ?? study.blindedReview;
  const changed = chosen !== study.blindedReview;

  const submit = (values: BlindedReviewValues) =>
    run(async () => {
      await update(study.id, { blindedReview: values.blindedReview, reason: values.reason.trim() });
      form.resetFields(['reason']);
      message.success(`Blinded review is ${values.blindedReview ? 'on' : 'off'}.`);
    });

  return (
    <Card title="Blinded review" role="region" aria-label="Blinded review">
      <Typography.Paragraph type="secondary">
        While on, analysts see each visit under a code, without its date, planned visit, group or
        the participant&apos;s other visits, until they record their decision on it. Monitors see
        every unblinding in the Ledger; reports are signed unblinded.
      </Typography.Paragraph>
      {canManage ? (
        <Form<BlindedReviewValues>
          form={form}
          key={`${study.id}-${study.updatedAt}`}
          layout="vertical"
          requiredMark={false}
          onFinish={submit}
          initialValues={{ blindedReview: study.blindedReview, reason: '' }}
        >
          <Form.Item label="Blind analysts to visit details" name="blindedReview">
            <Switch checkedChildren="On" unCheckedChildren="Off" />
          </Form.Item>
          {changed && (
            <Form.Item
              label="Reason for the change"
              name="reason"
              rules={[
                { required: true, whitespace: true, message: 'Give a reason.' },
                { min: REASON_MIN_LENGTH, message: `At least ${REASON_MIN_LENGTH} characters.` },
              ]}
            >
              <Input.TextArea rows={2} maxLength={2000} />
            </Form.Item>
          )}
          <Button type="primary" htmlType="submit" loading={busy} disabled={!changed}>
            Save blinded review
          </Button>
          <FormError error={error} />
        </Form>
      ) : (
        <Typography.Text strong>{study.blindedReview ? 'On' : 'Off'}</Typography.Text>
      )}
    </Card>
  );
}
