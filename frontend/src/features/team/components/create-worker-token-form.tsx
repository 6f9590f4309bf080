import type { CreatedWorkerTokenView } from '@gyre/shared';
import { Alert, Button, Form, Input, Modal, Typography } from 'antd';
import { useState } from 'react';
import { ModalForm } from '../../../components/modal-form';
import { useCreateWorkerToken } from '../api/create-worker-token';

/**
 * Names a new worker token, then shows its secret this one time with a copy button: Gyre keeps
 * only a hash of it, so closing the dialog without copying means making another token.
 */
export function CreateWorkerTokenForm({ open, onClose }: { open: boolean; onClose: () => void }) {
  const [form] = Form.useForm<{ name: string }>();
  const create = useCreateWorkerToken();
  const [created, setCreated] = useState<CreatedWorkerTokenView | null>(null);

  const close = () => {
    setCreated(null);
    form.resetFields();
    onClose();
  };

  if (created !== null) {
    // A Modal of its own (key): closing unmounts it at once, so the secret leaves the page
    // without waiting for the closing animation.
    return (
      <Modal
        key="secret"
        open={open}
        title={`Worker token "${created.name}"`}
        onCancel={close}
        maskClosable={false}
        footer={
          <Button type="primary" onClick={close}>
            I have copied it
          </Button>
        }
        destroyOnHidden
      >
        <Alert
          type="warning"
          showIcon
          title="Copy this token now: it will not be shown again."
          description="Gyre keeps only a hash of it. If it is lost, revoke it and create another."
          className="gyre-below"
        />
        <Typography.Paragraph className="gyre-break-all">
          <Typography.Text
            code
            copyable={{ text: created.secret, tooltips: ['Copy the token', 'Copied'] }}
            aria-label="The new worker token"
          >
            {created.secret}
          </Typography.Text>
        </Typography.Paragraph>
        <Typography.Paragraph type="secondary">
          The worker sends it as <Typography.Text code>Authorization: Bearer …</Typography.Text>. It
          may fetch the recordings of queued computations and post their results, nothing else.
        </Typography.Paragraph>
      </Modal>
    );
  }

  return (
    <ModalForm<{ name: string }>
      key="name"
      open={open}
      form={form}
      title="Create a worker token"
      okText="Create the token"
      intro={
        <Typography.Paragraph>
          A worker token lets a computing machine fetch queued recordings and post their results. It
          cannot sign in, and it reads no participants, results or accounts.
        </Typography.Paragraph>
      }
      failureText="The token could not be created."
      onSubmit={async ({ name }) => setCreated(await create(name.trim()))}
      onClose={close}
    >
      <Form.Item
        label="Name"
        name="name"
        extra="Say which machine will use it, e.g. “compute node 2”."
        rules={[
          { required: true, whitespace: true, message: 'Name the token.' },
          { max: 100, message: 'Keep the name under 100 characters.' },
        ]}
      >
        <Input autoFocus autoComplete="off" />
      </Form.Item>
    </ModalForm>
  );
}
