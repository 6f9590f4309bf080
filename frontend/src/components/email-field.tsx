import { Form, Input, type FormRule } from 'antd';

/**
 * The `email` field: one's own address at sign-in (`whose="your"`, the browser may fill it in),
 * or someone else's (`whose="their"`, up to the 254 characters an address can have, RFC 5321).
 */
export function EmailField({ whose }: { whose: 'your' | 'their' }) {
  const rules: FormRule[] = [
    { required: true, message: `Enter ${whose} e-mail address.` },
    { type: 'email', message: 'This is not an e-mail address.' },
  ];
  if (whose === 'their') {
    rules.push({ max: 254, message: 'An e-mail address has at most 254 characters.' });
  }
  return (
    <Form.Item label="E-mail" name="email" rules={rules}>
      <Input autoComplete={whose === 'your' ? 'username' : 'off'} autoFocus />
    </Form.Item>
  );
}
