import type { UserView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { isUsersKey } from './users';

/** `POST /api/users/:id/invitation`: e-mails the invitation again with a new link. */
export function resendInvitation(id: string): Promise<UserView> {
  return apiSend<UserView>(`/api/users/${encodeURIComponent(id)}/invitation`, 'POST');
}

export function useResendInvitation() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (id: string) => {
      const user = await resendInvitation(id);
      await mutate(isUsersKey);
      return user;
    },
    [mutate],
  );
}
