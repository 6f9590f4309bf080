import type { UserView } from '@gyre/shared';
import { Form, Input, Modal, Typography } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { useUpdateUser } from '../api/update-user';

/** Deactivates (ending every session at once) or reactivates an account, with a reason. */
export function AccountStateForm({
  user,
  target,
  onClose,
}: {
  user: UserView;
  target: 'active' | 'deactivated';
  onClose: () => void;
}) {
  const [form] = Form.useForm<{ reason: string }>();
  const update = useUpdateUser();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const deactivating = target === 'deactivated';

  const submit = async ({ reason }: { reason: string }) => {
    setBusy(true);
    setError(null);
    try {
      await update(user.id, { state: target, reason: reason.trim() });
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
      title={deactivating ? `Deactivate ${user.name}` : `Reactivate ${user.name}`}
      okText={deactivating ? 'Deactivate' : 'Reactivate'}
      okButtonProps={{ loading: busy, danger: deactivating }}
      onOk={() => form.submit()}
      onCancel={onClose}
      destroyOnHidden
    >
      <Typography.Paragraph>
        {deactivating
          ? `${user.email} will be signed out everywhere and cannot sign in until reactivated. Their past actions stay in the Ledger.`
          : `${user.email} will be able to sign in again with their password.`}
      </Typography.Paragraph>
      <Form<{ reason: string }>
        form={form}
        layout="vertical"
        requiredMark={false}
        onFinish={submit}
      >
        <Form.Item
          label="Reason"
          name="reason"
          extra="Kept in the Ledger beside the change."
          rules={[
            { required: true, whitespace: true, message: 'Give the reason.' },
            { max: 2000, message: 'Keep the reason under 2000 characters.' },
          ]}
        >
          <Input.TextArea rows={2} autoFocus />
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
