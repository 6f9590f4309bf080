import { apiSend } from '../../../lib/api-client';

/** `POST /api/auth/accept-invitation`: the invitation token, a password, perhaps a corrected name. */
export function acceptInvitation(body: {
  token: string;
  password: string;
  name?: string;
}): Promise<unknown> {
  return apiSend<unknown>('/api/auth/accept-invitation', 'POST', body);
}
