import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../lib/api-client';
import { ErrorState, isRetryable, pendingState } from './page-states';

const show = (error: unknown, onRetry = vi.fn()) => {
  render(
    <MemoryRouter>
      <ErrorState
        error={error}
        onRetry={onRetry}
        title="The visit could not be loaded"
        notFoundTitle="This visit does not exist or you cannot open it"
        back={{ to: '/participants', label: 'Back to participants' }}
      />
    </MemoryRouter>,
  );
  return onRetry;
};

describe('page states: which failures offer "Try again"', () => {
  // HTTP semantics (RFC 9110 §15.5, §15.6): a 4xx answer is about the request and repeating
  // it unchanged gets the same answer; 408 and 429 say "later"; 5xx is the server's failure.
  it.each([
    [0, true],
    [408, true],
    [429, true],
    [500, true],
    [503, true],
    [400, false],
    [403, false],
    [404, false],
    [409, false],
    [422, false],
  ])('status %i → retryable %s', (status, retryable) => {
    expect(isRetryable(new ApiError(status, 'X', 'x'))).toBe(retryable);
  });

  it('treats an unknown failure (no answer at all) as retryable', () => {
    expect(isRetryable(new TypeError('Failed to fetch'))).toBe(true);
  });

  it('a 404 names what is missing, offers the way back and no retry', () => {
    show(new ApiError(404, 'VISIT_NOT_FOUND', 'No visit v-1'));
    expect(screen.getByText('This visit does not exist or you cannot open it')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Back to participants' })).toHaveAttribute(
      'href',
      '/participants',
    );
  });

  it('a 404 of a part of a screen keeps its own title, without a retry', () => {
    render(
      <ErrorState
        error={new ApiError(404, 'ANALYSIS_RUN_NOT_FOUND', 'No run r-1.')}
        onRetry={() => undefined}
        title="The trial raster could not be loaded"
      />,
    );
    expect(screen.getByText('The trial raster could not be loaded')).toBeInTheDocument();
    expect(screen.getByRole('alert')).toHaveTextContent('No run r-1.');
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
  });

  it('a refused request (403) says why and offers no retry', () => {
    show(new ApiError(403, 'AUTH_FORBIDDEN', 'Your role may not open this.'));
    expect(screen.getByRole('alert')).toHaveTextContent('Your role may not open this.');
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
  });

  it('a network failure or a 5xx offers "Try again", and it calls back', async () => {
    const onRetry = show(new ApiError(0, 'NETWORK', 'Gyre could not reach the server.'));
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(onRetry).toHaveBeenCalledTimes(1);
  });

  it('a server failure (502) offers "Try again"', () => {
    show(new ApiError(502, 'BAD_GATEWAY', 'The server failed.'));
    expect(screen.getByRole('button', { name: 'Try again' })).toBeInTheDocument();
    expect(screen.getByText('The visit could not be loaded')).toBeInTheDocument();
  });
});

describe('pendingState: what a screen shows before its read has arrived', () => {
  const words = {
    errorTitle: 'The settings could not be loaded',
    loadingLabel: 'Loading the settings',
  };

  it('shows the failure with "Try again", which asks again', async () => {
    const mutate = vi.fn(() => Promise.resolve());
    render(<>{pendingState({ error: new ApiError(503, 'BUSY', 'Busy.'), mutate }, words)}</>);
    expect(screen.getByText('The settings could not be loaded')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(mutate).toHaveBeenCalledTimes(1);
  });

  it('shows the failure before stale data kept from an earlier answer', () => {
    const read = {
      data: { version: 1 },
      error: new ApiError(503, 'BUSY', 'Busy.'),
      mutate: vi.fn(),
    };
    render(<>{pendingState(read, words)}</>);
    expect(screen.getByText('The settings could not be loaded')).toBeInTheDocument();
  });

  it('shows the outline while nothing has arrived, and nothing once the data is there', () => {
    const { rerender } = render(<>{pendingState({ mutate: vi.fn() }, words)}</>);
    expect(screen.getByLabelText('Loading the settings')).toHaveAttribute('aria-busy', 'true');
    expect(pendingState({ data: { version: 1 }, mutate: vi.fn() }, words)).toBeNull();
    rerender(<>{pendingState({ data: null, mutate: vi.fn() }, words)}</>);
    expect(screen.queryByLabelText('Loading the settings')).not.toBeInTheDocument();
  });
});
