import type { Role, UserView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
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
  const { mutate } = useSWRConfig();
  return useCallback(
    async (body: InviteBody) => {
      const invited = await inviteUser(body);
      await mutate(isUsersKey);
      return invited;
    },
    [mutate],
  );
}
