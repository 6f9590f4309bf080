import { DatePicker, Form, type FormRule } from 'antd';
import dayjs, { type Dayjs } from 'dayjs';

const isAfterToday = (day: Dayjs) => day.isAfter(dayjs(), 'day');

/**
 * A date field that offers and accepts no day after today (a visit or an enrolment that has
 * already happened). `requiredMessage` makes it required; `noun` names it in the refusal.
 */
export function PastDateField({
  name,
  label,
  noun,
  requiredMessage,
  extra,
}: {
  name: string;
  label: string;
  /** "visit date": "The visit date cannot be in the future." */
  noun: string;
  requiredMessage: string | null;
  extra?: string;
}) {
  const rules: FormRule[] = [
    {
      validator: async (_rule: unknown, value: unknown) => {
        if (dayjs.isDayjs(value) && isAfterToday(value)) {
          throw new Error(`The ${noun} cannot be in the future.`);
        }
      },
    },
  ];
  if (requiredMessage !== null) rules.unshift({ required: true, message: requiredMessage });
  return (
    <Form.Item label={label} name={name} extra={extra} rules={rules}>
      <DatePicker format="D MMM YYYY" disabledDate={isAfterToday} className="gyre-fill-width" />
    </Form.Item>
  );
}
