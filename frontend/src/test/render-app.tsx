import type { MeResponse } from '@gyre/shared';
import { render } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { AppProvider } from '../app/provider';
import { SWRConfig } from 'swr';
import { routes } from '../app/router';
import { setAccessToken } from '../lib/api-client';
import { forgetSession, rememberSession } from '../lib/session/session-hint';
import { server } from './msw-server';

/**
 * The whole client at `path`, with a fresh SWR cache, signed in as `me` (or not at all);
 * `signedInBefore` says whether this browser remembers a session it may renew.
 */
export function renderApp(
  path: string,
  me: MeResponse | null,
  { signedInBefore = true }: { signedInBefore?: boolean } = {},
) {
  setAccessToken(me === null ? null : 'test-access-token');
  if (signedInBefore) rememberSession();
  else forgetSession();
  if (me !== null) {
    server.use(http.get('/api/auth/me', () => HttpResponse.json(me)));
  }
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const view = render(
    <AppProvider>
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <RouterProvider router={router} />
      </SWRConfig>
    </AppProvider>,
  );
  return { ...view, router };
}
