import type { MeResponse, Role } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { beforeEach, describe, expect, it } from 'vitest';
import { reviewWorklist } from '../features/home/testing/worklist-fixtures';
import { getAccessToken } from '../lib/api-client';
import { mightHaveSession } from '../lib/session/session-hint';
import { meFor } from '../test/fixtures';
import { installMswServer, server } from '../test/msw-server';
import { renderApp } from '../test/render-app';
import { errorResponse } from '../test/error-response';

installMswServer();

// The home screen asks for the worklist of analysts, monitors and technicians: answer it, so no
// request goes unhandled (these tests are about the session, not the list).
beforeEach(() => {
  server.use(http.get('/api/worklist', () => HttpResponse.json(reviewWorklist(false))));
});

const unauthenticated = () => errorResponse(401, 'AUTH_SIGN_IN_REQUIRED', 'Sign in first.');

async function menuLabels(): Promise<string[]> {
  const nav = await screen.findByRole('navigation', { name: 'Main' });
  return within(nav)
    .queryAllByRole('menuitem')
    .map((item) => item.textContent ?? '');
}

describe('navigation by role', () => {
  // The menus (technician: Intake; analyst: Participants; monitor: Participants,
  // Ledger; coordinator: Reports; admin: Team, Ledger, Outbox). Other screens may add entries,
  // but never one of these screens for a role that does not work from it.
  const SCREENS = ['Intake', 'Participants', 'Ledger', 'Reports', 'Team', 'Outbox'];
  const expected: [Role, string[]][] = [
    ['technician', ['Intake']],
    ['analyst', ['Participants']],
    ['monitor', ['Participants', 'Ledger']],
    ['coordinator', ['Reports']],
    ['admin', ['Ledger', 'Team', 'Outbox']],
  ];
  it.each(expected)('a %s sees %j in the menu', async (role, labels) => {
    renderApp('/', meFor(role));
    expect(await screen.findByText(`Welcome, ${meFor(role).user.name}`)).toBeInTheDocument();
    const menu = await menuLabels();
    expect(menu.filter((label) => SCREENS.includes(label))).toEqual(labels);
  });

  it.each([
    ['/ledger', 'technician'],
    ['/intake', 'monitor'],
    ['/team', 'analyst'],
    ['/reports', 'technician'],
    ['/outbox', 'coordinator'],
  ] as const)('%s tells a %s it is not available for their role', async (path, role) => {
    renderApp(path, meFor(role));
    expect(await screen.findByText('Not available for your role')).toBeInTheDocument();
    expect(screen.getByText(new RegExp(`not part of the ${role} role`))).toBeInTheDocument();
  });
});

describe('the session', () => {
  it('sends a visitor without a session to sign-in and back to where they were', async () => {
    const me = meFor('monitor');
    let signedIn = false;
    let meCalls = 0;
    // No refresh handler: this browser never signed in, so nothing may try to renew.
    server.use(
      http.get('/api/auth/me', () => {
        meCalls += 1;
        return signedIn ? HttpResponse.json(me) : unauthenticated();
      }),
      http.post('/api/auth/sign-in', () => {
        signedIn = true;
        return HttpResponse.json({
          accessToken: 'fresh-token',
          tokenType: 'Bearer',
          expiresInS: 900,
          user: me.user,
        });
      }),
      http.get('/api/audit', () =>
        HttpResponse.json({ items: [], total: 0, page: 1, pageSize: 50 }),
      ),
      http.get('/api/audit/verify', () =>
        HttpResponse.json({ intact: true, checked: 0, firstBroken: null, lastHash: null }),
      ),
      http.get('/api/users', () =>
        HttpResponse.json({ items: [], total: 0, page: 1, pageSize: 200 }),
      ),
    );
    const { router } = renderApp('/ledger?action=update', null, { signedInBefore: false });
    expect(await screen.findByRole('button', { name: 'Sign in' })).toBeInTheDocument();
    expect(meCalls).toBe(0);
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe(
      `?next=${encodeURIComponent('/ledger?action=update')}`,
    );
    await userEvent.type(screen.getByLabelText('E-mail'), me.user.email);
    await userEvent.type(screen.getByLabelText('Password'), 'correct horse battery');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/ledger'));
    expect(router.state.location.search).toBe('?action=update');
    expect(getAccessToken()).toBe('fresh-token');
    await waitFor(() => expect(meCalls).toBe(1));
  });

  it('goes to sign-in when the remembered session cannot be renewed, and forgets it', async () => {
    server.use(
      http.get('/api/auth/me', () => unauthenticated()),
      http.post('/api/auth/refresh', () => unauthenticated()),
    );
    const { router } = renderApp('/team', null, { signedInBefore: true });
    expect(await screen.findByRole('button', { name: 'Sign in' })).toBeInTheDocument();
    expect(new URLSearchParams(router.state.location.search).get('next')).toBe('/team');
    expect(mightHaveSession()).toBe(false);
  });

  it('after a reload renews the token from the cookie before asking who is signed in', async () => {
    const me: MeResponse = meFor('technician');
    let meCalls = 0;
    server.use(
      http.get('/api/auth/me', ({ request }) => {
        meCalls += 1;
        return request.headers.get('authorization') === 'Bearer renewed'
          ? HttpResponse.json(me)
          : unauthenticated();
      }),
      http.post('/api/auth/refresh', () =>
        HttpResponse.json({
          accessToken: 'renewed',
          tokenType: 'Bearer',
          expiresInS: 900,
          user: me.user,
        }),
      ),
    );
    renderApp('/', null);
    expect(await screen.findByText(`Welcome, ${me.user.name}`)).toBeInTheDocument();
    // Renewed first, so the one request carried the new token and was never refused.
    expect(meCalls).toBe(1);
  });

  it('after the session ends mid-use, sign-in says so and keeps the way back', async () => {
    const me = meFor('admin');
    server.use(
      http.post('/api/auth/refresh', () => unauthenticated()),
      http.get('/api/mail/outbox', () => unauthenticated()),
    );
    const { router } = renderApp('/outbox', me);
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(
      await screen.findByText('Your session has ended. Sign in again to go on where you were.'),
    ).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(new URLSearchParams(router.state.location.search).get('next')).toBe('/outbox');
  });

  it('signs out: tells the server and shows sign-in', async () => {
    let signedOut = false;
    server.use(
      http.post('/api/auth/sign-out', () => {
        signedOut = true;
        return new HttpResponse(null, { status: 204 });
      }),
    );
    const { router } = renderApp('/', meFor('coordinator'));
    await userEvent.click(await screen.findByRole('button', { name: 'Sign out' }));
    expect(
      await screen.findByText('You are signed out.', { selector: '.ant-alert *' }),
    ).toBeInTheDocument();
    expect(signedOut).toBe(true);
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(getAccessToken()).toBeNull();
    expect(mightHaveSession()).toBe(false);
  });

  it('shows a retry when the server cannot be reached at start', async () => {
    let calls = 0;
    server.use(
      http.get('/api/auth/me', () => {
        calls += 1;
        return calls === 1 ? HttpResponse.error() : HttpResponse.json(meFor('analyst'));
      }),
    );
    renderApp('/', null);
    expect(await screen.findByText('Gyre could not start')).toBeInTheDocument();
    expect(screen.getByRole('alert')).toHaveTextContent('Gyre could not reach the server');
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(await screen.findByText('Welcome, Ana Lyst')).toBeInTheDocument();
  });
});
