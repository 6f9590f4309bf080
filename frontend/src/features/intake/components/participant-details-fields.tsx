import type { StudyGroupView } from '@gyre/shared';
import { DatePicker, Form, Select } from 'antd';
import dayjs from 'dayjs';

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
      <Form.Item
        label="Enrolment date"
        name="enrolmentDate"
        extra="Day 0 of the visit schedule: each planned visit's window is counted from it."
        rules={[
          ...(requireEnrolment ? [{ required: true, message: 'Choose the enrolment date.' }] : []),
          {
            validator: async (_rule: unknown, value: unknown) => {
              if (dayjs.isDayjs(value) && value.isAfter(dayjs(), 'day')) {
                throw new Error('The enrolment date cannot be in the future.');
              }
            },
          },
        ]}
      >
        <DatePicker
          format="D MMM YYYY"
          disabledDate={(d) => d.isAfter(dayjs(), 'day')}
          className="gyre-fill-width"
        />
      </Form.Item>
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
