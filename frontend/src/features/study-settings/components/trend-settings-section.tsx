import type { StudyView } from '@gyre/shared';
import { App, Button, Card, Descriptions, Form, InputNumber, Space, Typography } from 'antd';
import { useSubmission } from '../../../lib/use-submission';
import { useUpdateTrendSettings, type TrendSettings } from '../api/studies';

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
            <Form.Item
              label="Visits needed for a trend"
              name="trendMinVisits"
              rules={[
                { required: true, message: 'Give a number of visits.' },
                { type: 'integer', min: 2, max: 50, message: 'From 2 to 50 visits.' },
              ]}
            >
              <InputNumber precision={0} suffix="visits" />
            </Form.Item>
            <Form.Item
              label="Days those visits must span"
              name="trendMinSpanDays"
              rules={[
                { required: true, message: 'Give a number of days.' },
                { type: 'integer', min: 0, max: 3650, message: 'From 0 to 3650 days.' },
              ]}
            >
              <InputNumber precision={0} suffix="days" />
            </Form.Item>
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
          items={[
            {
              key: 'visits',
              label: 'Visits needed for a trend',
              children: `${study.trendMinVisits} visits`,
            },
            {
              key: 'span',
              label: 'Days those visits must span',
              children: `${study.trendMinSpanDays} days`,
            },
          ]}
        />
      )}
    </Card>
  );
}
