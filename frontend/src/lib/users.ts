import type { UserView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from './api-client';

/** `GET /api/users/:userId`: a person named on a screen (for those who may read users). */
const userKey = (userId: string) => `/api/users/${encodeURIComponent(userId)}`;

/** Asks only when `allowed`, so that nobody's screen fires a request the rules refuse. */
export function useUser(userId: string, allowed: boolean) {
  return useSWR<UserView>(
    allowed ? userKey(userId) : null,
    () => apiFetch<UserView>(userKey(userId)),
    {
      shouldRetryOnError: false,
    },
  );
}
