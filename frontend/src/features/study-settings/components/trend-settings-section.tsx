import type { StudyView } from '@gyre/shared';
import { App, Button, Card, Descriptions, Form, InputNumber, Space, Typography } from 'antd';
import { useSubmission } from '../../../lib/use-submission';
import { useUpdateTrendSettings, type TrendSettings } from '../api/studies';

/** A trend setting: a whole number of `unit` from `min` to `max` (the server's limits). */
interface TrendField {
  name: keyof TrendSettings;
  label: string;
  unit: string;
  min: number;
  max: number;
}

const FIELDS: readonly TrendField[] = [
  { name: 'trendMinVisits', label: 'Visits needed for a trend', unit: 'visits', min: 2, max: 50 },
  {
    name: 'trendMinSpanDays',
    label: 'Days those visits must span',
    unit: 'days',
    min: 0,
    max: 3650,
  },
];

/**
 * When a participant's trend slope is shown: from how many visits with a value, spanning how
 * many days. Stored on the study; admins change them, the study's people read them.
 */
export function TrendSettingsSection({
  study,
  canManage,
}: {
  study: StudyView;
  canManage: boolean;
}) {
  const update = useUpdateTrendSettings();
  const { message } = App.useApp();
  const { busy, error, run } = useSubmission('The trend settings could not be saved.');
  const [form] = Form.useForm<TrendSettings>();

  const submit = (values: TrendSettings) =>
    run(async () => {
      await update(study.id, values);
      message.success('Trend settings saved.');
    });

  return (
    <Card title="Trend settings" role="region" aria-label="Trend settings">
      {canManage ? (
        <Form<TrendSettings>
          form={form}
          key={`${study.id}-${study.updatedAt}`}
          layout="vertical"
          requiredMark={false}
          onFinish={submit}
          initialValues={{
            trendMinVisits: study.trendMinVisits,
            trendMinSpanDays: study.trendMinSpanDays,
          }}
        >
          <Space wrap size={16} align="start">
            {FIELDS.map(({ name, label, unit, min, max }) => (
              <Form.Item
                key={name}
                label={label}
                name={name}
                rules={[
                  { required: true, message: `Give a number of ${unit}.` },
                  { type: 'integer', min, max, message: `From ${min} to ${max} ${unit}.` },
                ]}
              >
                <InputNumber precision={0} suffix={unit} />
              </Form.Item>
            ))}
          </Space>
          <Button type="primary" htmlType="submit" loading={busy}>
            Save trend settings
          </Button>
          {error !== null && (
            <Typography.Paragraph type="danger" role="alert" style={{ marginTop: 8 }}>
              {error}
            </Typography.Paragraph>
          )}
        </Form>
      ) : (
        <Descriptions
          size="small"
          column={{ xs: 1, md: 2 }}
          items={FIELDS.map(({ name, label, unit }) => ({
            key: name,
            label,
            children: `${study[name]} ${unit}`,
          }))}
        />
      )}
    </Card>
  );
}
