import type { FlagChange, FlagView, FlagSuggestion, VisitFlagView } from '@gyre/shared';
import { Alert, Button, Flex, Form, Input, Tag, Timeline, Typography } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { formatHz } from '../../../lib/format';
import { useVisitTime } from './visit-time';
import { useSubmission } from '../../../lib/use-submission';
import { NO_ROI_CHANNEL_REMAINS, leftOutText, roiUsageSentence } from '../../../lib/roi-usage';
import { formatCi } from './channel-table';
import { reasonRules } from './reason-rules';

export const FLAG_REASON_MIN_LENGTH = 10;

/** What the computation proposes, in words; it never raises a flag by itself. */
function SuggestionBox({ suggestion }: { suggestion: FlagSuggestion | null }) {
  let text: string;
  let roiNote: string | null = null;
  if (suggestion === null) {
    text = 'No task result yet, so the computation has nothing to suggest.';
  } else if (suggestion.roiUsage.status === 'none') {
    text = `${NO_ROI_CHANNEL_REMAINS}, so the computation has nothing to suggest.`;
    roiNote =
      suggestion.roiUsage.leftOut.length === 0
        ? null
        : `Left out: ${leftOutText(suggestion.roiUsage.leftOut)}.`;
  } else {
    roiNote = roiUsageSentence(suggestion.roiUsage);
    const numbers = `ROI Δf ${formatHz(suggestion.roiDeltaFHz)}, 95 % CI ${formatCi(suggestion.roiCiHz)}; study threshold ${formatHz(suggestion.flagThresholdHz)}.`;
    text = suggestion.suggestsSlowing
      ? `Suggests a slowing flag: the change is at or below the threshold and its interval excludes 0. ${numbers}`
      : `Does not suggest a slowing flag. ${numbers}`;
  }
  return (
    <section
      aria-label="Computation's suggestion"
      style={{
        border: `1px dashed ${GYRE_COLORS.line}`,
        background: GYRE_COLORS.mist,
        borderRadius: 6,
        padding: '10px 12px',
      }}
    >
      <Typography.Text type="secondary" className="gyre-caption-caps">
        COMPUTATION&apos;S SUGGESTION
      </Typography.Text>
      <div className="gyre-review-above-xxs gyre-figures">{text}</div>
      {roiNote !== null && (
        <div style={{ marginTop: 4, color: GYRE_COLORS.amberText }} data-testid="suggestion-roi">
          {roiNote}
        </div>
      )}
    </section>
  );
}

/** Names a person; the screen passes one that can look names up, tests a plain one. */
export type PersonRenderer = (userId: string) => React.ReactNode;

const plainPerson =
  (meId: string): PersonRenderer =>
  (userId) =>
    userId === meId ? 'you' : 'another analyst';

/** The analyst's decision: amber while a flag is raised. */
function DecisionBox({ current, who }: { current: FlagView | null; who: PersonRenderer }) {
  const formatTime = useVisitTime();
  const raised = current !== null && current.state === 'raised';
  return (
    <section
      aria-label="Analyst's decision"
      style={{
        border: `1px solid ${raised ? GYRE_COLORS.amber : GYRE_COLORS.line}`,
        background: raised ? GYRE_COLORS.amberBg : GYRE_COLORS.paper,
        borderRadius: 6,
        padding: '10px 12px',
      }}
    >
      <Typography.Text type="secondary" className="gyre-caption-caps">
        ANALYST&apos;S DECISION
      </Typography.Text>
      <div className="gyre-review-above-xxs">
        {current === null ? (
          'No slowing flag has been raised for this visit.'
        ) : raised ? (
          <>
            <Tag color={GYRE_COLORS.amberText}>Slowing flag raised</Tag>
            by {who(current.raisedById)}, {formatTime(current.raisedAt)}:{' '}
            <q>{current.raiseReason}</q>
          </>
        ) : (
          <>
            <Tag>Flag cleared</Tag>
            by {who(current.clearedById ?? '')}, {formatTime(current.clearedAt)}:{' '}
            <q>{current.clearReason}</q>
          </>
        )}
      </div>
    </section>
  );
}

/** Raise or clear, always with a written reason. */
function FlagForm({
  raised,
  onSubmit,
}: {
  raised: boolean;
  onSubmit: (change: FlagChange) => Promise<void>;
}) {
  const [form] = Form.useForm<{ reason: string }>();
  const { busy: saving, error: failure, run } = useSubmission('The flag could not be saved.');
  const action = raised ? 'Clear the flag' : 'Raise a slowing flag';
  return (
    <Form
      form={form}
      name="flag"
      layout="vertical"
      requiredMark={false}
      aria-label={action}
      onFinish={({ reason }) =>
        run(async () => {
          await onSubmit({ reason: reason.trim() });
          form.resetFields();
        })
      }
    >
      <Form.Item
        name="reason"
        label={raised ? 'Why clear it?' : 'Why raise it?'}
        rules={reasonRules(FLAG_REASON_MIN_LENGTH)}
      >
        <Input.TextArea rows={3} maxLength={2000} />
      </Form.Item>
      {failure !== null && (
        <Alert type="error" showIcon title={failure} role="alert" className="gyre-below-sm" />
      )}
      <Button
        htmlType="submit"
        loading={saving}
        type={raised ? 'default' : 'primary'}
        style={raised ? undefined : { background: GYRE_COLORS.amberText }}
      >
        {action}
      </Button>
    </Form>
  );
}

/** The slowing flag of one visit: suggestion, decision, form (analysts only) and history. */
export function FlagPanel({
  flag,
  meId,
  canChange,
  onRaise,
  onClear,
  renderPerson,
}: {
  flag: VisitFlagView;
  meId: string;
  renderPerson?: PersonRenderer;
  canChange: boolean;
  onRaise: (change: FlagChange) => Promise<void>;
  onClear: (change: FlagChange) => Promise<void>;
}) {
  const formatTime = useVisitTime();
  const raised = flag.current?.state === 'raised';
  const who = renderPerson ?? plainPerson(meId);
  const earlier = flag.history.filter((f) => f.id !== flag.current?.id || f.state === 'cleared');
  return (
    <Flex vertical gap={12}>
      <SuggestionBox suggestion={flag.suggestion} />
      <DecisionBox current={flag.current} who={who} />
      {canChange && <FlagForm raised={raised} onSubmit={raised ? onClear : onRaise} />}
      {earlier.length > 0 && (
        <div>
          <Typography.Text strong>History</Typography.Text>
          <Timeline
            className="gyre-above-sm"
            items={earlier.flatMap((f) => [
              {
                key: `${f.id}-raised`,
                color: GYRE_COLORS.amberText,
                content: (
                  <>
                    {formatTime(f.raisedAt)} raised by {who(f.raisedById)}: “{f.raiseReason}”
                  </>
                ),
              },
              ...(f.clearedAt === null
                ? []
                : [
                    {
                      key: `${f.id}-cleared`,
                      color: 'gray',
                      content: (
                        <>
                          {formatTime(f.clearedAt)} cleared by {who(f.clearedById ?? '')}: “
                          {f.clearReason ?? ''}”
                        </>
                      ),
                    },
                  ]),
            ])}
          />
        </div>
      )}
    </Flex>
  );
}
