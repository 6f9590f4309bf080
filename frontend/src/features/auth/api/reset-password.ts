import { apiSend } from '../../../lib/api-client';

/** `POST /api/auth/password-reset/confirm`: the token from the e-mailed link and the new password. */
export function resetPassword(body: { token: string; newPassword: string }): Promise<unknown> {
  return apiSend<unknown>('/api/auth/password-reset/confirm', 'POST', body);
}
