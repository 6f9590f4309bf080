import { apiSend } from '../../../lib/api-client';

/** `POST /api/auth/invitations/accept`: the invitation token, a password, perhaps a corrected name. */
export function acceptInvitation(body: {
  token: string;
  password: string;
  name?: string;
}): Promise<unknown> {
  return apiSend<unknown>('/api/auth/invitations/accept', 'POST', body);
}
