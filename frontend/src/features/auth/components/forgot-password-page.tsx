import { Button, Form, Input, Result, Typography } from 'antd';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { ApiError } from '../../../lib/api-client';
import { requestPasswordReset } from '../api/request-password-reset';
import { AuthLayout } from './auth-layout';

/** Asks for a reset link; says the same whether or not the address has an account. */
export function ForgotPasswordPage() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async ({ email }: { email: string }) => {
    setBusy(true);
    setError(null);
    try {
      await requestPasswordReset(email);
      setSentTo(email);
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The request failed. Try again.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <AuthLayout title="Reset your password">
      {sentTo !== null ? (
        <Result
          status="success"
          title="Check your e-mail"
          subTitle={`If ${sentTo} belongs to a Gyre account, a link to choose a new password is on its way. The link works once and for a short time.`}
          extra={<Link to={paths.signIn}>Back to sign-in</Link>}
        />
      ) : (
        <>
          <Typography.Paragraph type="secondary">
            Enter the e-mail address of your account. Gyre sends you a link to choose a new
            password.
          </Typography.Paragraph>
          <Form<{ email: string }> layout="vertical" requiredMark={false} onFinish={submit}>
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
            {error !== null && (
              <Typography.Paragraph type="danger" role="alert">
                {error}
              </Typography.Paragraph>
            )}
            <Button type="primary" htmlType="submit" block loading={busy}>
              Send the link
            </Button>
          </Form>
          <Typography.Paragraph style={{ marginTop: 16, marginBottom: 0 }}>
            <Link to={paths.signIn}>Back to sign-in</Link>
          </Typography.Paragraph>
        </>
      )}
    </AuthLayout>
  );
}
