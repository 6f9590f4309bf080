import { apiSend } from '../../../lib/api-client';

/**
 * `POST /api/auth/password-reset`: the server mails a reset link if the address
 * belongs to an account, and answers the same either way.
 */
export function requestPasswordReset(email: string): Promise<unknown> {
  return apiSend<unknown>('/api/auth/password-reset', 'POST', { email });
}
