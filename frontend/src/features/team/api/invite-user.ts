import type { Role, UserView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { isUsersKey } from './users';

export interface InviteBody {
  email: string;
  name: string;
  role: Role;
  studyId?: string;
  siteId?: string;
}

/** `POST /api/users/invitations`: creates an invited account and e-mails a single-use link. */
export function inviteUser(body: InviteBody): Promise<UserView> {
  return apiSend<UserView>('/api/users/invitations', 'POST', body);
}

export function useInviteUser() {
  return useWrite(inviteUser, (mutate) => mutate(isUsersKey));
}
