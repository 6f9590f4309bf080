import type { SessionResponse } from '@gyre/shared';
import { apiSend, setAccessToken } from '../../../lib/api-client';
import { rememberSession } from '../../../lib/session/session-hint';

export interface SignInBody {
  email: string;
  password: string;
}

/** `POST /api/auth/sign-in`: the access token comes back in the body, the refresh token as a cookie. */
export async function signIn(body: SignInBody): Promise<SessionResponse> {
  const session = await apiSend<SessionResponse>('/api/auth/sign-in', 'POST', body);
  setAccessToken(session.accessToken);
  rememberSession();
  return session;
}
