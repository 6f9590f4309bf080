import { apiFetch, setAccessToken } from '../api-client';
import { forgetSession } from './session-hint';

/** `POST /api/auth/sign-out`: revokes the refresh cookie's token family on the server. */
export async function signOut(): Promise<void> {
  try {
    await apiFetch<unknown>('/api/auth/sign-out', { method: 'POST' });
  } finally {
    setAccessToken(null);
    forgetSession();
  }
}
