import type { WorkerTokenView } from '@gyre/shared';
import { Typography } from 'antd';
import { ModalForm } from '../../../components/modal-form';
import { useRevokeWorkerToken } from '../api/revoke-worker-token';
import { ReasonField } from './reason-field';

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
  const revoke = useRevokeWorkerToken();
  return (
    <ModalForm<{ reason?: string }>
      title={`Revoke "${token.name}"?`}
      okText="Revoke"
      danger
      intro={
        <Typography.Paragraph>
          Workers using this token are refused from their next request. A revoked token cannot be
          restored: create a new one for the machine instead.
          {token.local && ' The server writes a new local token when it next starts.'}
        </Typography.Paragraph>
      }
      failureText="The token could not be revoked."
      onSubmit={async ({ reason }) => {
        const trimmed = reason?.trim();
        onRevoked(await revoke(token.id, trimmed === '' ? undefined : trimmed));
      }}
      onClose={onClose}
    >
      <ReasonField extra="Kept in the Ledger beside the revocation." />
    </ModalForm>
  );
}
