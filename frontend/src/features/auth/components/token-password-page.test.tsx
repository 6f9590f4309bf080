import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { installMswServer, server } from '../../../test/msw-server';
import { TokenPasswordPage } from './token-password-page';
import { errorResponse } from '../../../test/error-response';

installMswServer();

function renderAt(path: string, purpose: 'reset' | 'invitation') {
  const router = createMemoryRouter(
    [
      { path: '/reset-password', element: <TokenPasswordPage purpose={purpose} /> },
      { path: '/accept-invite', element: <TokenPasswordPage purpose={purpose} /> },
      { path: '/sign-in', element: <p>sign-in screen</p> },
    ],
    { initialEntries: [path] },
  );
  render(<RouterProvider router={router} />);
  return router;
}

describe('choosing a password from an e-mailed link', () => {
  it('checks length and repetition before anything is sent', async () => {
    // No handler: a request would be unhandled and fail the test.
    renderAt('/reset-password?token=abc', 'reset');
    await userEvent.type(screen.getByLabelText('New password'), 'short');
    await userEvent.type(screen.getByLabelText('Repeat the password'), 'shorter');
    await userEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    // PASSWORD_MIN_LENGTH is 12 in shared/accounts.ts; "short" has 5 characters.
    expect(
      await screen.findByText('The password has 5 characters; at least 12 are needed.'),
    ).toBeInTheDocument();
    expect(await screen.findByText('The two passwords differ.')).toBeInTheDocument();
  });

  it('sends token and new password, then shows sign-in', async () => {
    let body: unknown = null;
    server.use(
      http.post('/api/auth/password-reset/confirm', async ({ request }) => {
        body = await request.json();
        return new HttpResponse(null, { status: 204 });
      }),
    );
    const router = renderAt('/reset-password?token=t-123', 'reset');
    await userEvent.type(screen.getByLabelText('New password'), 'quiet river stone');
    await userEvent.type(screen.getByLabelText('Repeat the password'), 'quiet river stone');
    await userEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(router.state.location.search).toBe('?reason=password-reset');
    expect(body).toEqual({ token: 't-123', newPassword: 'quiet river stone' });
  });

  it("shows the server's reason when the link has expired", async () => {
    server.use(
      http.post('/api/auth/accept-invitation', () =>
        errorResponse(
          400,
          'AUTH_ONE_TIME_TOKEN_EXPIRED',
          'token: this link expired at 2025-01-08 09:00 UTC',
          { field: 'token' },
        ),
      ),
    );
    renderAt('/accept-invite?token=old', 'invitation');
    await userEvent.type(screen.getByLabelText('New password'), 'quiet river stone');
    await userEvent.type(screen.getByLabelText('Repeat the password'), 'quiet river stone');
    await userEvent.click(screen.getByRole('button', { name: 'Create my account' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(
      'token: this link expired at 2025-01-08 09:00 UTC',
    );
  });

  it('says so when the link has no token', () => {
    renderAt('/accept-invite', 'invitation');
    expect(screen.getByText('This link is incomplete')).toBeInTheDocument();
  });
});
