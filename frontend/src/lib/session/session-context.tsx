import type { MeResponse } from '@gyre/shared';
import { createContext, useContext } from 'react';

export interface Session {
  me: MeResponse;
  signOut: () => Promise<void>;
}

export const SessionContext = createContext<Session | null>(null);

/** The signed-in user; only screens inside the session gate may ask. */
export function useSession(): Session {
  const session = useContext(SessionContext);
  if (session === null) throw new Error('useSession() called outside the session gate');
  return session;
}
