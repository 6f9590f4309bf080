import { AbilityProvider } from '@casl/react';
import { App } from 'antd';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Navigate, useLocation, useNavigate } from 'react-router-dom';
import { useSWRConfig } from 'swr';
import { AppFrame } from '../components/app-frame';
import { ErrorState, LoadingState } from '../components/page-states';
import { UserMenu } from '../components/user-menu';
import { ApiError, getAccessToken, onSessionEnded } from '../lib/api-client';
import { abilityFromRules } from '../lib/session/ability';
import { useMe } from '../lib/session/me';
import { SessionContext, type Session } from '../lib/session/session-context';
import { mightHaveSession } from '../lib/session/session-hint';
import { signOut } from '../lib/session/sign-out';
import { navEntriesFor } from './navigation';
import { signInPath } from './paths';

/**
 * Every signed-in screen sits inside this gate: it loads who is signed in, provides their
 * abilities, and sends anyone without a session to sign-in and back to where they were.
 */
export function SessionGate() {
  // antd's App (message, modal, notification) starts here rather than around the whole
  // client, so the sign-in page does not download it (app/provider.tsx).
  return (
    <App>
      <SignedInScreens />
    </App>
  );
}

function SignedInScreens() {
  // Someone who never signed in here, or signed out, goes straight to sign-in.
  const [askServer] = useState(() => getAccessToken() !== null || mightHaveSession());
  const { data: me, error, isLoading, mutate: reloadMe } = useMe(askServer);
  const { mutate } = useSWRConfig();
  const location = useLocation();
  const navigate = useNavigate();
  const { message } = App.useApp();
  const [signingOut, setSigningOut] = useState(false);
  const here = `${location.pathname}${location.search}`;
  const hereRef = useRef(here);
  useEffect(() => {
    hereRef.current = here;
  }, [here]);

  useEffect(
    () =>
      onSessionEnded(() => {
        // Forget every cached answer: the next person to sign in must not see them.
        void mutate(() => true, undefined, { revalidate: false });
        // Fire and forget: the listener cannot wait, and the new screen reports its own state.
        void navigate(signInPath(hereRef.current, 'expired'), { replace: true });
      }),
    [mutate, navigate],
  );

  const ability = useMemo(() => (me ? abilityFromRules(me.rules) : null), [me]);

  const session = useMemo<Session | null>(
    () =>
      me
        ? {
            me,
            signOut: async () => {
              setSigningOut(true);
              try {
                await signOut();
              } catch {
                // The server may already have ended the session; the client forgets it anyway.
              } finally {
                setSigningOut(false);
              }
              await mutate(() => true, undefined, { revalidate: false });
              message.success('You are signed out.');
              await navigate(signInPath(undefined, 'signed-out'), { replace: true });
            },
          }
        : null,
    [me, mutate, navigate, message],
  );

  if (!askServer || (error instanceof ApiError && error.isUnauthenticated)) {
    return <Navigate to={signInPath(here)} replace />;
  }
  if (error !== undefined) {
    return (
      <div className="gyre-screen-padding">
        <ErrorState error={error} onRetry={() => void reloadMe()} title="Gyre could not start" />
      </div>
    );
  }
  if (isLoading || me === undefined || ability === null || session === null) {
    return (
      <div className="gyre-screen-padding">
        <LoadingState label="Signing you in" />
      </div>
    );
  }

  const place = [me.study?.code, me.site?.name].filter(Boolean).join(' · ');
  return (
    <SessionContext.Provider value={session}>
      <AbilityProvider value={ability}>
        <AppFrame
          navItems={navEntriesFor(me.user.role, ability)}
          aside={
            <UserMenu
              name={me.user.name}
              role={me.user.role}
              place={place.length > 0 ? place : null}
              onSignOut={() => void session.signOut()}
              signingOut={signingOut}
            />
          }
        />
      </AbilityProvider>
    </SessionContext.Provider>
  );
}
