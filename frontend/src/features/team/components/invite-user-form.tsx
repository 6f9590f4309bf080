import type { UserView } from '@gyre/shared';
import { Form, Input } from 'antd';
import { ModalForm } from '../../../components/modal-form';
import { useInviteUser } from '../api/invite-user';
import { MembershipFields, membershipBody, type MembershipValues } from './membership-fields';
import { EmailField } from '../../../components/email-field';

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
  return (
    <ModalForm<Values>
      open={open}
      form={form}
      title="Invite someone to Gyre"
      okText="Send invitation"
      failureText="The invitation could not be sent."
      onSubmit={async (values) => {
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
      }}
      onClose={onClose}
    >
      <EmailField whose="their" />
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
    </ModalForm>
  );
}
