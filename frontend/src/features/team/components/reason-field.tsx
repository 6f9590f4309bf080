import { Form, Input } from 'antd';

/**
 * The reason an account or token change keeps in the Ledger. `required` is the message shown
 * when it is left empty; without it the reason is optional.
 */
export function ReasonField({
  required,
  extra = 'Kept in the Ledger beside the change.',
  autoFocus,
}: {
  required?: string;
  extra?: string;
  autoFocus?: boolean;
}) {
  return (
    <Form.Item
      label={required === undefined ? 'Reason (optional)' : 'Reason'}
      name="reason"
      extra={extra}
      rules={[
        ...(required === undefined
          ? []
          : [{ required: true, whitespace: true, message: required }]),
        { max: 2000, message: 'Keep the reason under 2000 characters.' },
      ]}
    >
      <Input.TextArea rows={2} autoFocus={autoFocus} />
    </Form.Item>
  );
}
