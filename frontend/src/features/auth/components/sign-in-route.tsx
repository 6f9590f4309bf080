import { useNavigate, useSearchParams } from 'react-router-dom';
import { useSWRConfig } from 'swr';
import { isSafeReturnPath, paths } from '../../../app/paths';
import { signIn } from '../api/sign-in';
import { SignInPage } from './sign-in-page';

const NOTICES: Record<string, string> = {
  expired: 'Your session has ended. Sign in again to go on where you were.',
  'signed-out': 'You are signed out.',
  'password-reset': 'Your password is changed. Sign in with the new one.',
  'invitation-accepted': 'Your account is ready. Sign in with your e-mail and new password.',
};

/** Sign-in wired to the server; afterwards the user goes back to where they were. */
export function SignInRoute() {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const { mutate } = useSWRConfig();
  const next = search.get('next');
  const reason = search.get('reason');
  return (
    <SignInPage
      notice={reason !== null ? NOTICES[reason] : undefined}
      onSignIn={async (values) => {
        await signIn(values);
        // Drop anything cached from an earlier session before the first screen loads.
        await mutate(() => true, undefined, { revalidate: false });
        await navigate(isSafeReturnPath(next) ? next : paths.home, { replace: true });
      }}
    />
  );
}
