import { Alert, Button, Form, Input, Typography } from 'antd';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { paths, signInPath } from '../../../app/paths';
import { useSubmission } from '../../../lib/use-submission';
import { acceptInvitation } from '../api/accept-invitation';
import { resetPassword } from '../api/reset-password';
import { AuthLayout } from './auth-layout';
import { PasswordFields } from './password-fields';

interface Values {
  name?: string;
  password: string;
  passwordRepeat: string;
}

/**
 * The two screens reached from an e-mailed link (`?token=`): choosing a new password, and
 * accepting an invitation (which also asks for the person's name).
 */
export function TokenPasswordPage({ purpose }: { purpose: 'reset' | 'invitation' }) {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const token = search.get('token');
  const { busy, error, run } = useSubmission('That did not work. Try again.');
  const title = purpose === 'reset' ? 'Choose a new password' : 'Join your study on Gyre';

  if (token === null || token.length === 0) {
    return (
      <AuthLayout title={title}>
        <Alert
          type="warning"
          showIcon
          title="This link is incomplete"
          description="Open the link from your e-mail again, or copy the whole address into the browser."
        />
        <Typography.Paragraph className="gyre-flush gyre-above">
          <Link to={paths.signIn}>Back to sign-in</Link>
        </Typography.Paragraph>
      </AuthLayout>
    );
  }

  const submit = (values: Values) =>
    run(async () => {
      if (purpose === 'reset') {
        await resetPassword({ token, newPassword: values.password });
        await navigate(signInPath(undefined, 'password-reset'), { replace: true });
      } else {
        const name = values.name?.trim();
        await acceptInvitation({
          token,
          password: values.password,
          ...(name !== undefined && name.length > 0 ? { name } : {}),
        });
        await navigate(signInPath(undefined, 'invitation-accepted'), { replace: true });
      }
    });

  return (
    <AuthLayout title={title}>
      {purpose === 'invitation' && (
        <Typography.Paragraph type="secondary">
          You have been invited to Gyre. Choose a password to activate your account; correct your
          name if your administrator spelt it differently.
        </Typography.Paragraph>
      )}
      <Form<Values> layout="vertical" requiredMark={false} onFinish={submit}>
        {purpose === 'invitation' && (
          <Form.Item
            label="Your name (optional)"
            name="name"
            extra="Leave empty to keep the name in your invitation."
            rules={[{ max: 200, message: 'Keep the name under 200 characters.' }]}
          >
            <Input autoComplete="name" autoFocus />
          </Form.Item>
        )}
        <PasswordFields />
        {error !== null && (
          <Typography.Paragraph type="danger" role="alert">
            {error}
          </Typography.Paragraph>
        )}
        <Button type="primary" htmlType="submit" block loading={busy}>
          {purpose === 'reset' ? 'Save the new password' : 'Create my account'}
        </Button>
      </Form>
    </AuthLayout>
  );
}
