import type { UserView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/users/:userId`: who saved a settings version (for those who may read users). */
export const userKey = (userId: string) => `/api/users/${encodeURIComponent(userId)}`;

export function getUser(userId: string): Promise<UserView> {
  return apiFetch<UserView>(userKey(userId));
}

/** Asks only when `allowed`, so that nobody's screen fires a request the rules refuse. */
export function useUser(userId: string, allowed: boolean) {
  return useSWR<UserView>(allowed ? userKey(userId) : null, () => getUser(userId), {
    shouldRetryOnError: false,
  });
}
