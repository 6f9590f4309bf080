import type { ParticipantView, StudyGroupView } from '@gyre/shared';
import { Form, Input } from 'antd';
import dayjs, { type Dayjs } from 'dayjs';
import { ModalForm } from '../../../components/modal-form';
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
  const update = useUpdateParticipant();
  return (
    <ModalForm<Values>
      open={open}
      title={`Enrolment and group of ${participant.code}`}
      okText="Save"
      failureText="The change could not be saved."
      initialValues={{
        enrolmentDate: participant.enrolmentDate === null ? null : dayjs(participant.enrolmentDate),
        groupId: participant.groupId ?? undefined,
      }}
      onSubmit={async (values) => {
        const saved = await update(participant, {
          enrolmentDate: dayjs.isDayjs(values.enrolmentDate)
            ? values.enrolmentDate.format('YYYY-MM-DD')
            : null,
          groupId: values.groupId ?? null,
          ...(values.reason?.trim() ? { reason: values.reason.trim() } : {}),
        });
        onSaved(saved);
      }}
      onClose={onClose}
    >
      <ParticipantScheduleFields groups={groups} requireEnrolment={false} />
      <Form.Item label="Reason for the change" name="reason" rules={[{ max: 2000 }]}>
        <Input.TextArea autoSize={{ minRows: 2 }} />
      </Form.Item>
    </ModalForm>
  );
}
