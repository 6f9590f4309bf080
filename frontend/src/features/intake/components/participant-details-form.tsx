import type { ParticipantView, StudyGroupView } from '@gyre/shared';
import { Form, Input, Modal, Typography } from 'antd';
import dayjs, { type Dayjs } from 'dayjs';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { useUpdateParticipant } from '../api/update-participant';
import { ParticipantScheduleFields } from './participant-details-fields';

interface Values {
  enrolmentDate?: Dayjs | null;
  groupId?: string | null;
  reason?: string;
}

/** Changes a participant's enrolment date and group, with a reason for the audit trail. */
export function ParticipantDetailsForm({
  open,
  participant,
  groups,
  onClose,
  onSaved,
}: {
  open: boolean;
  participant: ParticipantView;
  groups: StudyGroupView[];
  onClose: () => void;
  onSaved: (participant: ParticipantView) => void;
}) {
  const [form] = Form.useForm<Values>();
  const update = useUpdateParticipant();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (values: Values) => {
    setBusy(true);
    setError(null);
    try {
      const saved = await update(participant, {
        enrolmentDate: dayjs.isDayjs(values.enrolmentDate)
          ? values.enrolmentDate.format('YYYY-MM-DD')
          : null,
        groupId: values.groupId ?? null,
        ...(values.reason?.trim() ? { reason: values.reason.trim() } : {}),
      });
      onSaved(saved);
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The change could not be saved.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal
      open={open}
      title={`Enrolment and group of ${participant.code}`}
      okText="Save"
      onOk={() => form.submit()}
      okButtonProps={{ loading: busy }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Form<Values>
        form={form}
        layout="vertical"
        requiredMark={false}
        onFinish={submit}
        initialValues={{
          enrolmentDate:
            participant.enrolmentDate === null ? null : dayjs(participant.enrolmentDate),
          groupId: participant.groupId ?? undefined,
        }}
      >
        <ParticipantScheduleFields groups={groups} requireEnrolment={false} />
        <Form.Item label="Reason for the change" name="reason" rules={[{ max: 2000 }]}>
          <Input.TextArea autoSize={{ minRows: 2 }} />
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
