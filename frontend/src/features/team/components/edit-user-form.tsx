import type { UserView } from '@gyre/shared';
import { Form, Input, Modal, Typography } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { useUpdateUser } from '../api/update-user';
import { MembershipFields, membershipBody, type MembershipValues } from './membership-fields';

interface Values extends MembershipValues {
  reason: string;
}

/** Changes a user's role and where they belong, with the reason the Ledger will keep. */
export function EditUserForm({ user, onClose }: { user: UserView; onClose: () => void }) {
  const [form] = Form.useForm<Values>();
  const update = useUpdateUser();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (values: Values) => {
    setBusy(true);
    setError(null);
    try {
      await update(user.id, { ...membershipBody(values), reason: values.reason.trim() });
      onClose();
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The change could not be saved.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal
      open
      title={`Role and site of ${user.name}`}
      okText="Save the change"
      onOk={() => form.submit()}
      okButtonProps={{ loading: busy }}
      onCancel={onClose}
      destroyOnHidden
    >
      <Form<Values>
        form={form}
        layout="vertical"
        requiredMark={false}
        onFinish={submit}
        initialValues={{
          role: user.role,
          studyId: user.studyId ?? undefined,
          siteId: user.siteId ?? undefined,
        }}
      >
        <MembershipFields />
        <Form.Item
          label="Reason"
          name="reason"
          extra="Kept in the Ledger beside the change."
          rules={[
            { required: true, whitespace: true, message: 'Say why the role or site changes.' },
            { max: 2000, message: 'Keep the reason under 2000 characters.' },
          ]}
        >
          <Input.TextArea rows={2} />
        </Form.Item>
        {error !== null && (
          <Typography.Paragraph type="danger" role="alert">
            {error}
          </Typography.Paragraph>
        )}
      </Form>
    </Modal>
  );
}
