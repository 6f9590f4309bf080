import type { UserView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { isUsersKey } from './users';

/** `POST /api/users/:id/invitation`: e-mails the invitation again with a new link. */
export function resendInvitation(id: string): Promise<UserView> {
  return apiSend<UserView>(`/api/users/${encodeURIComponent(id)}/invitation`, 'POST');
}

export function useResendInvitation() {
  return useWrite(resendInvitation, (mutate) => mutate(isUsersKey));
}
