import { Alert, Button, Form, Input, Typography } from 'antd';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { useSubmission } from '../../../lib/use-submission';
import { AuthLayout } from './auth-layout';
import { EmailField } from '../../../components/email-field';
import { FormError } from '../../../components/form-error';

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
  const { busy, error, run } = useSubmission('Sign-in failed. Try again.');

  const submit = (values: SignInValues) => run(() => onSignIn(values));

  return (
    <AuthLayout title="Sign in">
      {notice !== undefined && <Alert type="info" showIcon title={notice} className="gyre-below" />}
      <Form<SignInValues> layout="vertical" requiredMark={false} onFinish={submit}>
        <EmailField whose="your" />
        <Form.Item
          label="Password"
          name="password"
          rules={[{ required: true, message: 'Enter your password.' }]}
        >
          <Input.Password autoComplete="current-password" />
        </Form.Item>
        <FormError error={error} />
        <Button type="primary" htmlType="submit" block loading={busy}>
          Sign in
        </Button>
      </Form>
      <Typography.Paragraph className="gyre-flush gyre-above">
        <Link to={paths.forgotPassword}>Forgot your password?</Link>
      </Typography.Paragraph>
    </AuthLayout>
  );
}
