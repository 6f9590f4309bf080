import type { WorkerTokenView } from '@gyre/shared';
import { Form, Input, Modal, Typography } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { useRevokeWorkerToken } from '../api/revoke-worker-token';

/** Asks before revoking a worker token; the reason is optional and kept in the Ledger. */
export function RevokeWorkerTokenForm({
  token,
  onClose,
  onRevoked,
}: {
  token: WorkerTokenView;
  onClose: () => void;
  onRevoked: (token: WorkerTokenView) => void;
}) {
  const [form] = Form.useForm<{ reason?: string }>();
  const revoke = useRevokeWorkerToken();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async ({ reason }: { reason?: string }) => {
    setBusy(true);
    setError(null);
    try {
      const trimmed = reason?.trim();
      onRevoked(await revoke(token.id, trimmed === '' ? undefined : trimmed));
    } catch (caught) {
      setError(caught instanceof ApiError ? caught.message : 'The token could not be revoked.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal
      open
      title={`Revoke "${token.name}"?`}
      okText="Revoke"
      okButtonProps={{ loading: busy, danger: true }}
      onOk={() => form.submit()}
      onCancel={onClose}
      destroyOnHidden
    >
      <Typography.Paragraph>
        Workers using this token are refused from their next request. A revoked token cannot be
        restored: create a new one for the machine instead.
        {token.local && ' The server writes a new local token when it next starts.'}
      </Typography.Paragraph>
      <Form<{ reason?: string }>
        form={form}
        layout="vertical"
        requiredMark={false}
        onFinish={submit}
      >
        <Form.Item
          label="Reason (optional)"
          name="reason"
          extra="Kept in the Ledger beside the revocation."
          rules={[{ max: 2000, message: 'Keep the reason under 2000 characters.' }]}
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
