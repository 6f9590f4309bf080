import type { VisitFlagView } from '@gyre/shared';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../../lib/api-client';
import { NO_FLAG } from '../testing/review-fixtures';
import { FlagPanel } from './flag-panel';

const RAISED: VisitFlagView = {
  ...NO_FLAG,
  suggestion: {
    ...NO_FLAG.suggestion!,
    suggestsSlowing: false,
    roiDeltaFHz: -0.05,
    roiCiHz: [-0.2, 0.1],
  },
  current: {
    id: 'flag-1',
    visitId: NO_FLAG.visitId,
    state: 'raised',
    raisedById: 'user-other',
    raiseReason: 'Slower after onset than at the last visit',
    raisedAt: '2025-02-04T09:00:00.000Z',
    clearedById: null,
    clearReason: null,
    clearedAt: null,
  },
};

function renderPanel(flag: VisitFlagView, canChange = true) {
  const onRaise = vi.fn(async () => undefined);
  const onClear = vi.fn(async () => undefined);
  render(
    <FlagPanel
      flag={flag}
      meId="user-analyst"
      canChange={canChange}
      onRaise={onRaise}
      onClear={onClear}
    />,
  );
  return { onRaise, onClear };
}

describe('FlagPanel', () => {
  it('asks for a reason before raising, and for at least 10 characters', async () => {
    const { onRaise } = renderPanel(NO_FLAG);
    await userEvent.click(screen.getByRole('button', { name: 'Raise a slowing flag' }));
    expect(await screen.findByText('A reason is required.')).toBeInTheDocument();
    await userEvent.type(screen.getByLabelText('Why raise it?'), 'too short');
    await userEvent.click(screen.getByRole('button', { name: 'Raise a slowing flag' }));
    expect(await screen.findByText('Write at least 10 characters (9 so far).')).toBeInTheDocument();
    expect(onRaise).not.toHaveBeenCalled();
  });

  it('sends a reason of exactly 10 characters, trimmed', async () => {
    const { onRaise, onClear } = renderPanel(NO_FLAG);
    await userEvent.type(screen.getByLabelText('Why raise it?'), '  ten chars!  ');
    await userEvent.click(screen.getByRole('button', { name: 'Raise a slowing flag' }));
    await waitFor(() => expect(onRaise).toHaveBeenCalledWith({ reason: 'ten chars!' }));
    expect(onClear).not.toHaveBeenCalled();
  });

  it("keeps the computation's suggestion apart from the analyst's decision", () => {
    renderPanel(RAISED);
    const suggestion = screen.getByRole('region', { name: "Computation's suggestion" });
    const decision = screen.getByRole('region', { name: "Analyst's decision" });
    expect(suggestion).toHaveTextContent('Does not suggest a slowing flag');
    expect(decision).toHaveTextContent('Slowing flag raised');
    expect(decision).toHaveTextContent('Slower after onset than at the last visit');
    // The decision box is amber (#C77C02, Gyre's look) while a flag is raised.
    expect(decision).toHaveStyle({ borderColor: '#C77C02' });
    expect(suggestion).not.toHaveStyle({ borderColor: '#C77C02' });
  });

  it('offers to clear a raised flag, again with a reason', async () => {
    const { onClear, onRaise } = renderPanel(RAISED);
    await userEvent.type(
      screen.getByLabelText('Why clear it?'),
      'Artefact in the post window on review',
    );
    await userEvent.click(screen.getByRole('button', { name: 'Clear the flag' }));
    await waitFor(() =>
      expect(onClear).toHaveBeenCalledWith({ reason: 'Artefact in the post window on review' }),
    );
    expect(onRaise).not.toHaveBeenCalled();
  });

  it("shows the server's refusal in words", async () => {
    const onRaise = vi.fn(async () => {
      throw new ApiError(409, 'FLAG_ALREADY_RAISED', 'This visit already has a raised flag.');
    });
    render(<FlagPanel flag={NO_FLAG} meId="me" canChange onRaise={onRaise} onClear={vi.fn()} />);
    await userEvent.type(screen.getByLabelText('Why raise it?'), 'Clear slowing after onset');
    await userEvent.click(screen.getByRole('button', { name: 'Raise a slowing flag' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(
      'This visit already has a raised flag.',
    );
  });

  it('has no form for someone who may only read', () => {
    renderPanel(RAISED, false);
    expect(screen.getByRole('region', { name: "Analyst's decision" })).toBeInTheDocument();
    expect(screen.queryByRole('textbox')).not.toBeInTheDocument();
    expect(screen.queryByRole('button')).not.toBeInTheDocument();
  });
});
