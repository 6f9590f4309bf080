import type { VisitView } from '@gyre/shared';
import { DatePicker, Form, Input, Modal, Typography } from 'antd';
import dayjs, { type Dayjs } from 'dayjs';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { useCreateVisit } from '../api/create-visit';

interface Values {
  label: string;
  visitDate: Dayjs;
}

/** Registers a visit: a label unique for the participant (e.g. "V2") and the date it took place. */
export function NewVisitForm({
  open,
  participantId,
  participantCode,
  existingLabels,
  onClose,
  onCreated,
}: {
  open: boolean;
  participantId: string;
  participantCode: string;
  existingLabels: string[];
  onClose: () => void;
  onCreated: (visit: VisitView) => void;
}) {
  const [form] = Form.useForm<Values>();
  const createVisit = useCreateVisit();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (values: Values) => {
    setBusy(true);
    setError(null);
    try {
      const visit = await createVisit({
        participantId,
        label: values.label.trim(),
        visitDate: values.visitDate.format('YYYY-MM-DD'),
      });
      form.resetFields();
      onCreated(visit);
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The visit could not be saved.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal
      open={open}
      title={`New visit for ${participantCode}`}
      okText="Register visit"
      onOk={() => form.submit()}
      okButtonProps={{ loading: busy }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Form<Values> form={form} layout="vertical" requiredMark={false} onFinish={submit}>
        <Form.Item
          label="Visit label"
          name="label"
          extra="As your protocol names it, e.g. V1, V2, Month 6."
          rules={[
            { required: true, whitespace: true, message: 'Give the visit a label.' },
            { max: 40, message: 'A label has at most 40 characters.' },
            {
              validator: async (_rule, value: unknown) => {
                if (typeof value !== 'string') return;
                const wanted = value.trim().toLowerCase();
                if (existingLabels.some((label) => label.toLowerCase() === wanted)) {
                  throw new Error(
                    `${participantCode} already has a visit labelled ${value.trim()}.`,
                  );
                }
              },
            },
          ]}
        >
          <Input autoFocus />
        </Form.Item>
        <Form.Item
          label="Visit date"
          name="visitDate"
          rules={[
            { required: true, message: 'Choose the date of the visit.' },
            {
              validator: async (_rule, value: unknown) => {
                if (dayjs.isDayjs(value) && value.isAfter(dayjs(), 'day')) {
                  throw new Error('The visit date cannot be in the future.');
                }
              },
            },
          ]}
        >
          <DatePicker
            format="D MMM YYYY"
            disabledDate={(date) => date.isAfter(dayjs(), 'day')}
            style={{ width: '100%' }}
          />
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
