import type { UserView } from '@gyre/shared';
import { ModalForm } from '../../../components/modal-form';
import { useUpdateUser } from '../api/update-user';
import { MembershipFields, membershipBody, type MembershipValues } from './membership-fields';
import { ReasonField } from './reason-field';

interface Values extends MembershipValues {
  reason: string;
}

/** Changes a user's role and where they belong, with the reason the Ledger will keep. */
export function EditUserForm({ user, onClose }: { user: UserView; onClose: () => void }) {
  const update = useUpdateUser();
  return (
    <ModalForm<Values>
      title={`Role and site of ${user.name}`}
      okText="Save the change"
      failureText="The change could not be saved."
      initialValues={{
        role: user.role,
        studyId: user.studyId ?? undefined,
        siteId: user.siteId ?? undefined,
      }}
      onSubmit={async (values) => {
        await update(user.id, { ...membershipBody(values), reason: values.reason.trim() });
        onClose();
      }}
      onClose={onClose}
    >
      <MembershipFields />
      <ReasonField required="Say why the role or site changes." />
    </ModalForm>
  );
}
