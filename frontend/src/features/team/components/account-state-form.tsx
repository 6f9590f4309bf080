import type { UserView } from '@gyre/shared';
import { Typography } from 'antd';
import { ModalForm } from '../../../components/modal-form';
import { useUpdateUser } from '../api/update-user';
import { ReasonField } from './reason-field';

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
  const update = useUpdateUser();
  const deactivating = target === 'deactivated';
  return (
    <ModalForm<{ reason: string }>
      title={deactivating ? `Deactivate ${user.name}` : `Reactivate ${user.name}`}
      okText={deactivating ? 'Deactivate' : 'Reactivate'}
      danger={deactivating}
      intro={
        <Typography.Paragraph>
          {deactivating
            ? `${user.email} will be signed out everywhere and cannot sign in until reactivated. Their past actions stay in the Ledger.`
            : `${user.email} will be able to sign in again with their password.`}
        </Typography.Paragraph>
      }
      failureText="The change could not be saved."
      onSubmit={async ({ reason }) => {
        await update(user.id, { state: target, reason: reason.trim() });
        onClose();
      }}
      onClose={onClose}
    >
      <ReasonField required="Give the reason." autoFocus />
    </ModalForm>
  );
}
