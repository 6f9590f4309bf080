import type { BlindedDecisionChange, VisitBlindingView } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it, vi } from 'vitest';
import { installCanvasMock } from '../../../components/charts/testing/canvas-mock';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { PARTICIPANT, VISIT } from '../testing/review-fixtures';
import { NOT_BLINDED, serveReview } from '../testing/serve-review';

vi.mock(
  '../../../components/charts/g2-plot',
  () => import('../../../components/charts/testing/fake-g2-plot'),
);

installMswServer();
installCanvasMock();

// Generated test data: an invented code.
const BLINDED: VisitBlindingView = { ...NOT_BLINDED, code: 'B-7KQ2', blinded: true };

describe('Review under blinded review', { timeout: 180_000 }, () => {
  it('shows the code and the notice, never asks for the visit, then shows it after the decision', async () => {
    const asked: string[] = [];
    const sent: BlindedDecisionChange[] = [];
    let blinding = BLINDED;
    serveReview({ timesBlinded: () => blinding.blinded });
    server.use(
      http.get(`/api/visits/${VISIT.id}/blinding`, () => HttpResponse.json(blinding)),
      http.get(`/api/visits/${VISIT.id}`, () => {
        asked.push('visit');
        return HttpResponse.json(VISIT);
      }),
      http.post(`/api/visits/${VISIT.id}/blinding/decision`, async ({ request }) => {
        const change = (await request.json()) as BlindedDecisionChange;
        sent.push(change);
        blinding = {
          ...BLINDED,
          blinded: false,
          decision: {
            decision: change.decision,
            reason: change.reason,
            flagId: null,
            decidedAt: '2025-02-10T10:00:00.000Z',
          },
        };
        return HttpResponse.json(blinding, { status: 201 });
      }),
    );
    renderApp(`/review/${VISIT.id}`, meFor('analyst'));
    expect(
      await screen.findByRole('heading', { name: 'Review · visit B-7KQ2' }, { timeout: 15_000 }),
    ).toBeInTheDocument();
    expect(screen.getByRole('note', { name: 'Blinded review' })).toHaveTextContent(
      'Blinded review: visit details hidden until you record your decision.',
    );
    expect(screen.queryByText(/Trajectory of/)).toBeNull();
    expect(screen.queryByText(PARTICIPANT.code)).toBeNull();
    expect(asked).toEqual([]);
    // Times of the visit read as time after its first upload, never as a date.
    const sources = await screen.findByTestId('source-task', {}, { timeout: 15_000 });
    await waitFor(() =>
      expect(sources).toHaveTextContent(
        /computed \+5\s+min after first upload, once the file was accepted/,
      ),
    );
    expect(sources).toHaveTextContent('uploaded at first upload');
    const main = screen.getByRole('main');
    expect(main.textContent).not.toMatch(/1970|2025/);

    const card = screen.getByRole('generic', { name: 'Blinded decision' });
    await userEvent.click(within(card).getByLabelText('No flag'));
    // One paste rather than a keystroke each: every keystroke renders the whole Review again.
    await userEvent.click(within(card).getByLabelText('Reason'));
    await userEvent.paste('PAF steady, nothing to flag');
    await userEvent.click(within(card).getByRole('button', { name: 'Record the decision' }));

    expect(
      await screen.findByText(
        `Review · ${PARTICIPANT.code} · ${VISIT.label}`,
        {},
        { timeout: 15_000 },
      ),
    ).toBeInTheDocument();
    expect(sent).toEqual([{ decision: 'noFlag', reason: 'PAF steady, nothing to flag' }]);
    await waitFor(() => expect(asked).toEqual(['visit']));
    expect(screen.queryByRole('note', { name: 'Blinded review' })).toBeNull();
    // The same times, now as dates.
    expect(screen.getByTestId('source-task')).toHaveTextContent(/uploaded 3 Feb 2025, \d\d:\d\d/);
    expect(screen.getByRole('main').textContent).not.toContain('after first upload');
  });
});
