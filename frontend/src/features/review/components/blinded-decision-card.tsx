import type { BlindedDecision, BlindedDecisionChange, VisitBlindingView } from '@gyre/shared';
import { Button, Card, Form, Input, Radio, Typography } from 'antd';
import { formatDateTime } from '../../../lib/format';
import { FormError } from '../../../components/form-error';
import { useSubmission } from '../../../lib/use-submission';
import { FLAG_REASON_MIN_LENGTH } from './flag-panel';
import { reasonRules } from './reason-rules';

const DECISION_WORDS: Record<BlindedDecision, string> = {
  flag: 'Raise a slowing flag',
  noFlag: 'No flag',
};

/**
 * Blinded review: the analyst's decision on a visit they see under its code only. A flag
 * raised or "no flag", always with a reason; once recorded the visit is unblinded for them.
 */
export function BlindedDecisionCard({
  blinding,
  onDecide,
}: {
  blinding: VisitBlindingView;
  onDecide: (change: BlindedDecisionChange) => Promise<unknown>;
}) {
  const [form] = Form.useForm<BlindedDecisionChange>();
  const { busy, error, run } = useSubmission('The decision could not be recorded.');
  const decided = blinding.decision;
  return (
    <Card
      title={`Your decision on visit ${blinding.code ?? ''}`}
      aria-label="Blinded decision"
      styles={{ title: { whiteSpace: 'normal', overflowWrap: 'anywhere' } }}
    >
      {decided !== null ? (
        <Typography.Paragraph className="gyre-flush">
          {DECISION_WORDS[decided.decision]}, recorded {formatDateTime(decided.decidedAt)}:{' '}
          <q>{decided.reason}</q>
        </Typography.Paragraph>
      ) : (
        <Form<BlindedDecisionChange>
          form={form}
          name="blinded-decision"
          layout="vertical"
          requiredMark={false}
          onFinish={(values) =>
            run(async () => {
              await onDecide({ decision: values.decision, reason: values.reason.trim() });
            })
          }
        >
          <Form.Item
            label="Decision"
            name="decision"
            rules={[{ required: true, message: 'Choose a flag or no flag.' }]}
          >
            <Radio.Group
              options={(['flag', 'noFlag'] as const).map((value) => ({
                value,
                label: DECISION_WORDS[value],
              }))}
            />
          </Form.Item>
          <Form.Item label="Reason" name="reason" rules={reasonRules(FLAG_REASON_MIN_LENGTH)}>
            <Input.TextArea rows={3} maxLength={2000} />
          </Form.Item>
          <Typography.Paragraph type="secondary">
            Once recorded, the visit&apos;s date, planned visit, group and participant are shown to
            you; the unblinding is kept in the Ledger.
          </Typography.Paragraph>
          <Button type="primary" htmlType="submit" loading={busy}>
            Record the decision
          </Button>
          <FormError error={error} />
        </Form>
      )}
    </Card>
  );
}
