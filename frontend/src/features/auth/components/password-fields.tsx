import { PASSWORD_MAX_BYTES, PASSWORD_MIN_LENGTH } from '@gyre/shared';
import { Form, Input } from 'antd';

/** A new password and its repetition, with the server's length rules checked first. */
export function PasswordFields() {
  return (
    <>
      <Form.Item
        label="New password"
        name="password"
        extra={`At least ${PASSWORD_MIN_LENGTH} characters. A few unrelated words work well.`}
        rules={[
          { required: true, message: 'Choose a password.' },
          {
            validator: async (_rule, value: unknown) => {
              if (typeof value !== 'string' || value.length === 0) return;
              const length = [...value].length;
              if (length < PASSWORD_MIN_LENGTH) {
                throw new Error(
                  `The password has ${length} characters; at least ${PASSWORD_MIN_LENGTH} are needed.`,
                );
              }
              if (new TextEncoder().encode(value).length > PASSWORD_MAX_BYTES) {
                throw new Error(`The password is longer than ${PASSWORD_MAX_BYTES} bytes.`);
              }
            },
          },
        ]}
      >
        <Input.Password autoComplete="new-password" />
      </Form.Item>
      <Form.Item
        label="Repeat the password"
        name="passwordRepeat"
        dependencies={['password']}
        rules={[
          { required: true, message: 'Repeat the password.' },
          ({ getFieldValue }) => ({
            validator: async (_rule, value: unknown) => {
              if (
                typeof value === 'string' &&
                value.length > 0 &&
                value !== getFieldValue('password')
              ) {
                throw new Error('The two passwords differ.');
              }
            },
          }),
        ]}
      >
        <Input.Password autoComplete="new-password" />
      </Form.Item>
    </>
  );
}
