import type { PlannedVisitView } from '@gyre/shared';
import {
  App,
  Button,
  Card,
  Form,
  Input,
  InputNumber,
  Modal,
  Popconfirm,
  Space,
  Table,
  Typography,
} from 'antd';
import { useState } from 'react';
import { EmptyState, ErrorState } from '../../../components/page-states';
import { ApiError } from '../../../lib/api-client';
import { usePlannedVisits, useScheduleWrites, type PlannedVisitInput } from '../api/study-schedule';

/** "−14 / +14 days"; a side without slack reads "on the day" ("up to 14 days after"). */
export function windowText(p: Pick<PlannedVisitView, 'windowBeforeDays' | 'windowAfterDays'>) {
  const before = p.windowBeforeDays;
  const after = p.windowAfterDays;
  if (before === 0 && after === 0) return 'on the day';
  if (before === 0) return `up to ${after} days after`;
  if (after === 0) return `up to ${before} days before`;
  return `−${before} / +${after} days`;
}

/**
 * The study's visit schedule: each planned visit's target day after enrolment and its window.
 * Admins add, change and delete planned visits (one in use cannot be deleted); others read.
 */
export function VisitScheduleSection({
  studyId,
  canManage,
}: {
  studyId: string;
  canManage: boolean;
}) {
  const schedule = usePlannedVisits(studyId);
  const writes = useScheduleWrites(studyId);
  const { message } = App.useApp();
  const [editing, setEditing] = useState<PlannedVisitView | 'new' | null>(null);

  const remove = async (planned: PlannedVisitView) => {
    try {
      await writes.deletePlannedVisit(planned.id);
      message.success(`${planned.name} deleted from the schedule.`);
    } catch (caught) {
      message.error(
        caught instanceof ApiError ? caught.message : 'The planned visit could not be deleted.',
      );
    }
  };

  return (
    <Card
      title="Visit schedule"
      role="region"
      aria-label="Visit schedule"
      extra={
        canManage && (
          <Button type="primary" onClick={() => setEditing('new')}>
            Add planned visit
          </Button>
        )
      }
    >
      <Typography.Paragraph type="secondary">
        Days count from each participant&apos;s enrolment date (day 0). A visit registered outside
        its planned visit&apos;s window is marked early or late wherever it is listed.
      </Typography.Paragraph>
      {schedule.error !== undefined ? (
        <ErrorState
          title="The schedule could not be loaded"
          error={schedule.error}
          onRetry={() => void schedule.mutate()}
        />
      ) : schedule.data !== undefined && schedule.data.length === 0 ? (
        <EmptyState
          description={
            canManage
              ? 'No planned visits yet: visits are registered with labels of their own until you add some.'
              : 'The study has no visit schedule: visits are registered with labels of their own.'
          }
        />
      ) : (
        <Table<PlannedVisitView>
          aria-label="Planned visits"
          rowKey="id"
          size="middle"
          pagination={false}
          loading={schedule.data === undefined}
          dataSource={schedule.data ?? []}
          scroll={{ x: 'max-content' }}
          columns={[
            { key: 'name', title: 'Planned visit', render: (_, p) => p.name },
            {
              key: 'targetDay',
              title: 'Target day',
              align: 'right',
              className: 'gyre-figures',
              render: (_, p) => `day ${p.targetDay}`,
            },
            {
              key: 'window',
              title: 'Allowed window',
              className: 'gyre-figures',
              render: (_, p) => windowText(p),
            },
            ...(canManage
              ? [
                  {
                    key: 'actions',
                    title: 'Actions',
                    render: (_: unknown, p: PlannedVisitView) => (
                      <Space size={4} wrap>
                        <Button
                          size="small"
                          onClick={() => setEditing(p)}
                          aria-label={`Change ${p.name}`}
                        >
                          Change
                        </Button>
                        <Popconfirm
                          title={`Delete ${p.name}?`}
                          description="Only a planned visit no visit was registered on can be deleted."
                          okText="Delete"
                          onConfirm={() => remove(p)}
                        >
                          <Button size="small" danger aria-label={`Delete ${p.name}`}>
                            Delete
                          </Button>
                        </Popconfirm>
                      </Space>
                    ),
                  },
                ]
              : []),
          ]}
        />
      )}
      {canManage && editing !== null && (
        <PlannedVisitForm
          planned={editing === 'new' ? null : editing}
          nextPosition={schedule.data?.length ?? 0}
          onClose={() => setEditing(null)}
          onSave={async (input) => {
            const saved = await writes.savePlannedVisit(
              editing === 'new' ? null : editing.id,
              input,
            );
            message.success(`${saved.name} saved.`);
            setEditing(null);
          }}
        />
      )}
    </Card>
  );
}

function PlannedVisitForm({
  planned,
  nextPosition,
  onClose,
  onSave,
}: {
  planned: PlannedVisitView | null;
  nextPosition: number;
  onClose: () => void;
  onSave: (input: PlannedVisitInput) => Promise<void>;
}) {
  const [form] = Form.useForm<PlannedVisitInput>();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const submit = async (values: PlannedVisitInput) => {
    setBusy(true);
    setError(null);
    try {
      await onSave({ ...values, name: values.name.trim() });
    } catch (caught) {
      setError(
        caught instanceof ApiError ? caught.message : 'The planned visit could not be saved.',
      );
    } finally {
      setBusy(false);
    }
  };
  const dayRules = [
    { required: true, message: 'Give a whole number of days.' },
    { type: 'integer' as const, min: 0, message: 'A whole number of days, 0 or more.' },
  ];
  return (
    <Modal
      open
      title={planned === null ? 'New planned visit' : `Change ${planned.name}`}
      okText="Save planned visit"
      onOk={() => form.submit()}
      okButtonProps={{ loading: busy }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Form<PlannedVisitInput>
        form={form}
        layout="vertical"
        requiredMark={false}
        onFinish={submit}
        initialValues={
          planned ?? {
            targetDay: undefined,
            windowBeforeDays: 0,
            windowAfterDays: 0,
            position: nextPosition,
          }
        }
      >
        <Form.Item
          label="Name"
          name="name"
          extra="Visits registered on it take this name, e.g. Baseline, Week 12."
          rules={[
            { required: true, whitespace: true, message: 'Give the planned visit a name.' },
            { max: 40, message: 'A name has at most 40 characters.' },
          ]}
        >
          <Input autoFocus />
        </Form.Item>
        <Form.Item label="Target day after enrolment" name="targetDay" rules={dayRules}>
          <InputNumber min={0} precision={0} suffix="days" style={{ width: '100%' }} />
        </Form.Item>
        <Space.Compact block>
          <Form.Item
            label="Window before"
            name="windowBeforeDays"
            rules={dayRules}
            style={{ flex: 1 }}
          >
            <InputNumber min={0} precision={0} suffix="days" style={{ width: '100%' }} />
          </Form.Item>
          <Form.Item
            label="Window after"
            name="windowAfterDays"
            rules={dayRules}
            style={{ flex: 1 }}
          >
            <InputNumber min={0} precision={0} suffix="days" style={{ width: '100%' }} />
          </Form.Item>
        </Space.Compact>
        <Form.Item label="Order in the schedule" name="position" rules={dayRules}>
          <InputNumber min={0} precision={0} style={{ width: '100%' }} />
        </Form.Item>
        {error !== null && (
          <Typography.Paragraph type="danger" role="alert">
            {error}
          </Typography.Paragraph>
        )}
      </Form>
    </Modal>
  );
}
