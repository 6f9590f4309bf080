import type { UserView } from '@gyre/shared';
import { Form, Input, Modal, Typography } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { useInviteUser } from '../api/invite-user';
import { MembershipFields, membershipBody, type MembershipValues } from './membership-fields';

interface Values extends MembershipValues {
  email: string;
  name: string;
}

/** Invites someone by e-mail: Gyre creates the account and mails a single-use link. */
export function InviteUserForm({
  open,
  onClose,
  onInvited,
}: {
  open: boolean;
  onClose: () => void;
  onInvited: (user: UserView) => void;
}) {
  const [form] = Form.useForm<Values>();
  const invite = useInviteUser();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (values: Values) => {
    setBusy(true);
    setError(null);
    try {
      const membership = membershipBody(values);
      const user = await invite({
        email: values.email.trim(),
        name: values.name.trim(),
        role: membership.role,
        ...(membership.studyId !== null ? { studyId: membership.studyId } : {}),
        ...(membership.siteId !== null ? { siteId: membership.siteId } : {}),
      });
      form.resetFields();
      onInvited(user);
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The invitation could not be sent.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal
      open={open}
      title="Invite someone to Gyre"
      okText="Send invitation"
      onOk={() => form.submit()}
      okButtonProps={{ loading: busy }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Form<Values> form={form} layout="vertical" requiredMark={false} onFinish={submit}>
        <Form.Item
          label="E-mail"
          name="email"
          rules={[
            { required: true, message: 'Enter their e-mail address.' },
            { type: 'email', message: 'This is not an e-mail address.' },
            { max: 254, message: 'An e-mail address has at most 254 characters.' },
          ]}
        >
          <Input autoFocus autoComplete="off" />
        </Form.Item>
        <Form.Item
          label="Name"
          name="name"
          rules={[
            { required: true, whitespace: true, message: 'Enter their name.' },
            { max: 200, message: 'Keep the name under 200 characters.' },
          ]}
        >
          <Input autoComplete="off" />
        </Form.Item>
        <MembershipFields />
        {error !== null && (
          <Typography.Paragraph type="danger" role="alert">
            {error}
          </Typography.Paragraph>
        )}
      </Form>
    </Modal>
  );
}
