import { PARTICIPANT_CODE_PATTERN, type ParticipantView, type StudyGroupView } from '@gyre/shared';
import { Form, Input, Modal, Typography } from 'antd';
import type { Dayjs } from 'dayjs';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { useCreateParticipant } from '../api/create-participant';
import { ParticipantScheduleFields } from './participant-details-fields';

interface Values {
  code: string;
  enrolmentDate: Dayjs;
  groupId?: string;
}

/**
 * Registers a participant by pseudonymous code at the technician's site (never a name), with
 * the enrolment date the visit schedule counts from and, if the study has groups, a group.
 */
export function NewParticipantForm({
  open,
  siteId,
  siteName,
  groups,
  onClose,
  onCreated,
}: {
  open: boolean;
  siteId: string;
  siteName: string;
  groups: StudyGroupView[];
  onClose: () => void;
  onCreated: (participant: ParticipantView) => void;
}) {
  const [form] = Form.useForm<Values>();
  const createParticipant = useCreateParticipant();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async ({ code, enrolmentDate, groupId }: Values) => {
    setBusy(true);
    setError(null);
    try {
      const participant = await createParticipant({
        code: code.trim(),
        siteId,
        enrolmentDate: enrolmentDate.format('YYYY-MM-DD'),
        ...(groupId === undefined ? {} : { groupId }),
      });
      form.resetFields();
      onCreated(participant);
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The participant could not be saved.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal
      open={open}
      title={`New participant at ${siteName}`}
      okText="Register participant"
      onOk={() => form.submit()}
      okButtonProps={{ loading: busy }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Form<Values> form={form} layout="vertical" requiredMark={false} onFinish={submit}>
        <Form.Item
          label="Participant code"
          name="code"
          extra="The study's pseudonymous code, e.g. AC-0042. Never a name or a date of birth."
          normalize={(value: string) => value.toUpperCase()}
          rules={[
            { required: true, whitespace: true, message: 'Enter the participant code.' },
            {
              pattern: PARTICIPANT_CODE_PATTERN,
              message:
                'A code is 3–24 capital letters and digits in groups joined by hyphens, with at least one digit (e.g. AC-0042).',
            },
          ]}
        >
          <Input autoFocus />
        </Form.Item>
        <ParticipantScheduleFields groups={groups} requireEnrolment />
        {error !== null && (
          <Typography.Paragraph type="danger" role="alert">
            {error}
          </Typography.Paragraph>
        )}
      </Form>
    </Modal>
  );
}
