import type { StudyGroupView } from '@gyre/shared';
import { Form, Select } from 'antd';
import { PastDateField } from './past-date-field';

/** The enrolment date and group fields, shared by registering and editing a participant. */
export function ParticipantScheduleFields({
  groups,
  requireEnrolment,
}: {
  groups: StudyGroupView[];
  requireEnrolment: boolean;
}) {
  return (
    <>
      <PastDateField
        name="enrolmentDate"
        label="Enrolment date"
        noun="enrolment date"
        requiredMessage={requireEnrolment ? 'Choose the enrolment date.' : null}
        extra="Day 0 of the visit schedule: each planned visit's window is counted from it."
      />
      {groups.length > 0 && (
        <Form.Item label="Group" name="groupId">
          <Select
            allowClear
            placeholder="No group"
            options={groups.map((g) => ({ value: g.id, label: g.name }))}
          />
        </Form.Item>
      )}
    </>
  );
}
