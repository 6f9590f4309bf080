import type { Role, UserView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { isUsersKey } from './users';

export interface UserChange {
  name?: string;
  role?: Role;
  studyId?: string | null;
  siteId?: string | null;
  state?: 'active' | 'deactivated';
  /** Why; kept in the audit trail. */
  reason?: string;
}

/** `PATCH /api/users/:id`: role and membership, or (de)activation, which ends every session. */
export function updateUser(id: string, change: UserChange): Promise<UserView> {
  return apiSend<UserView>(`/api/users/${encodeURIComponent(id)}`, 'PATCH', change);
}

export function useUpdateUser() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (id: string, change: UserChange) => {
      const updated = await updateUser(id, change);
      await mutate(isUsersKey);
      return updated;
    },
    [mutate],
  );
}
