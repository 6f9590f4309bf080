import { createBrowserRouter } from 'react-router-dom';
import { AppFrame } from '../components/app-frame';
import { NotFoundPage } from '../components/not-found-page';
import { SignInPage } from '../features/auth/components/sign-in-page';
import { HomePage } from '../features/home/home-page';
import { paths } from './paths';

async function signInNotYetConnected(): Promise<void> {
  throw new Error('Sign-in is not connected yet.');
}

export function createRouter() {
  return createBrowserRouter([
    { path: paths.signIn, element: <SignInPage onSignIn={signInNotYetConnected} /> },
    {
      path: paths.home,
      element: <AppFrame />,
      children: [
        { index: true, element: <HomePage /> },
        { path: '*', element: <NotFoundPage /> },
      ],
    },
  ]);
}
