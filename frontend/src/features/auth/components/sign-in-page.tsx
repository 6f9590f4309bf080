import { Button, Card, Form, Input, Typography } from 'antd';
import { useState } from 'react';
import { GyreMark } from '../../../components/gyre-mark';
import { ResearchCaution } from '../../../components/research-caution';
import { ApiError } from '../../../lib/api-client';

export interface SignInValues {
  email: string;
  password: string;
}

/** The sign-in screen; `onSignIn` does the request so the layout can be tested alone. */
export function SignInPage({ onSignIn }: { onSignIn: (values: SignInValues) => Promise<void> }) {
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
    <main
      style={{
        minHeight: '100vh',
        display: 'grid',
        placeItems: 'center',
        padding: 24,
        background: 'linear-gradient(160deg, #F4F7F7 0%, #E3ECEC 100%)',
      }}
    >
      <div style={{ width: 420, maxWidth: '100%' }}>
        <div style={{ display: 'flex', alignItems: 'center', gap: 12, marginBottom: 20 }}>
          <GyreMark size={40} />
          <div>
            <Typography.Title level={2} style={{ margin: 0, color: '#24525A' }}>
              Gyre
            </Typography.Title>
            <Typography.Text type="secondary">
              Alpha-frequency review for EEG studies
            </Typography.Text>
          </div>
        </div>
        <Card>
          <Typography.Title level={4} style={{ marginTop: 0 }}>
            Sign in
          </Typography.Title>
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
        </Card>
        <div style={{ marginTop: 16 }}>
          <ResearchCaution />
        </div>
      </div>
    </main>
  );
}
