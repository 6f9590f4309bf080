import { PARTICIPANT_CODE_PATTERN, type ParticipantView, type StudyGroupView } from '@gyre/shared';
import { Form, Input } from 'antd';
import type { Dayjs } from 'dayjs';
import { ModalForm } from '../../../components/modal-form';
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
  return (
    <ModalForm<Values>
      open={open}
      form={form}
      title={`New participant at ${siteName}`}
      okText="Register participant"
      failureText="The participant could not be saved."
      onSubmit={async ({ code, enrolmentDate, groupId }) => {
        const participant = await createParticipant({
          code: code.trim(),
          siteId,
          enrolmentDate: enrolmentDate.format('YYYY-MM-DD'),
          ...(groupId === undefined ? {} : { groupId }),
        });
        form.resetFields();
        onCreated(participant);
      }}
      onClose={onClose}
    >
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
    </ModalForm>
  );
}
