import { Button, Form, Result, Typography } from 'antd';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { useSubmission } from '../../../lib/use-submission';
import { requestPasswordReset } from '../api/request-password-reset';
import { AuthLayout } from './auth-layout';
import { EmailField } from '../../../components/email-field';
import { FormError } from '../../../components/form-error';

/** Asks for a reset link; says the same whether or not the address has an account. */
export function ForgotPasswordPage() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { busy, error, run } = useSubmission('The request failed. Try again.');

  const submit = ({ email }: { email: string }) =>
    run(async () => {
      await requestPasswordReset(email);
      setSentTo(email);
    });

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
            <EmailField whose="your" />
            <FormError error={error} />
            <Button type="primary" htmlType="submit" block loading={busy}>
              Send the link
            </Button>
          </Form>
          <Typography.Paragraph className="gyre-flush gyre-above">
            <Link to={paths.signIn}>Back to sign-in</Link>
          </Typography.Paragraph>
        </>
      )}
    </AuthLayout>
  );
}
