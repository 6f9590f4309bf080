import type { MeResponse } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../api-client';

/** `GET /api/auth/me`: the signed-in user, their study and site, and their packed rules. */
export const meKey = '/api/auth/me';

export function getMe(): Promise<MeResponse> {
  return apiFetch<MeResponse>(meKey);
}

/** `enabled: false` asks nothing (nobody can be signed in). */
export function useMe(enabled = true) {
  return useSWR<MeResponse>(enabled ? meKey : null, getMe, {
    // Who is signed in changes only by signing in or out, both of which revalidate this key.
    revalidateIfStale: false,
    shouldRetryOnError: false,
  });
}
