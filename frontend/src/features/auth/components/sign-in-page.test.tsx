import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../../lib/api-client';
import { SignInPage, type SignInValues } from './sign-in-page';

const renderPage = (onSignIn: (values: SignInValues) => Promise<void>) =>
  render(
    <MemoryRouter>
      <SignInPage onSignIn={onSignIn} />
    </MemoryRouter>,
  );

describe('SignInPage', () => {
  it('asks for a valid e-mail and a password before calling the server', async () => {
    const onSignIn = vi.fn(async () => undefined);
    renderPage(onSignIn);
    await userEvent.type(screen.getByLabelText('E-mail'), 'not-an-address');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('This is not an e-mail address.')).toBeInTheDocument();
    expect(await screen.findByText('Enter your password.')).toBeInTheDocument();
    expect(onSignIn).not.toHaveBeenCalled();
  });

  it("shows the server's message when sign-in is refused", async () => {
    const onSignIn = vi.fn(async () => {
      throw new ApiError(401, 'AUTH_INVALID_CREDENTIALS', 'E-mail or password is wrong.');
    });
    renderPage(onSignIn);
    await userEvent.type(screen.getByLabelText('E-mail'), 'ana@example.org');
    await userEvent.type(screen.getByLabelText('Password'), 'a long password');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() =>
      expect(onSignIn).toHaveBeenCalledWith({
        email: 'ana@example.org',
        password: 'a long password',
      }),
    );
    expect(await screen.findByRole('alert')).toHaveTextContent('E-mail or password is wrong.');
  });
});
