import { Alert, Button, Form, Input, Typography } from 'antd';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { ApiError } from '../../../lib/api-client';
import { AuthLayout } from './auth-layout';

export interface SignInValues {
  email: string;
  password: string;
}

/** The sign-in screen; `onSignIn` does the request so the layout can be tested alone. */
export function SignInPage({
  onSignIn,
  notice,
}: {
  onSignIn: (values: SignInValues) => Promise<void>;
  /** Why the user is here, e.g. their session ended. */
  notice?: string;
}) {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (values: SignInValues) => {
    setBusy(true);
    setError(null);
    try {
      await onSignIn(values);
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'Sign-in failed. Try again.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <AuthLayout title="Sign in">
      {notice !== undefined && (
        <Alert type="info" showIcon title={notice} style={{ marginBottom: 16 }} />
      )}
      <Form<SignInValues> layout="vertical" requiredMark={false} onFinish={submit}>
        <Form.Item
          label="E-mail"
          name="email"
          rules={[
            { required: true, message: 'Enter your e-mail address.' },
            { type: 'email', message: 'This is not an e-mail address.' },
          ]}
        >
          <Input autoComplete="username" autoFocus />
        </Form.Item>
        <Form.Item
          label="Password"
          name="password"
          rules={[{ required: true, message: 'Enter your password.' }]}
        >
          <Input.Password autoComplete="current-password" />
        </Form.Item>
        {error !== null && (
          <Typography.Paragraph type="danger" role="alert">
            {error}
          </Typography.Paragraph>
        )}
        <Button type="primary" htmlType="submit" block loading={busy}>
          Sign in
        </Button>
      </Form>
      <Typography.Paragraph style={{ marginTop: 16, marginBottom: 0 }}>
        <Link to={paths.forgotPassword}>Forgot your password?</Link>
      </Typography.Paragraph>
    </AuthLayout>
  );
}
