import type { ReportSignOffView, Role } from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it, vi } from 'vitest';
import { installCanvasMock } from '../../../components/charts/testing/canvas-mock';
import { drawnMarks } from '../../../components/charts/testing/drawn-marks';
import { errorResponse, failingOnce } from '../../../test/error-response';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { NO_FLAG, PARTICIPANT, recording, REPORT, VISIT } from '../testing/review-fixtures';
import { serveReview } from '../testing/serve-review';

// jsdom has no canvas for the chart library: a stand-in shows which marks would be drawn.
vi.mock(
  '../../../components/charts/g2-plot',
  () => import('../../../components/charts/testing/fake-g2-plot'),
);

installMswServer();
const canvas = installCanvasMock();

/** Handlers for one visit; `keepFlag` leaves a test's own flag handler in front. */
function serveVisit(keepFlag = false) {
  serveReview(keepFlag ? { flag: null } : {});
}

async function openReview(role: Role, options: { keepFlag?: boolean } = {}) {
  serveVisit(options.keepFlag === true);
  renderApp(`/review/${VISIT.id}`, meFor(role));
  await screen.findByText(`Review · ${PARTICIPANT.code} · ${VISIT.label}`, {}, { timeout: 15_000 });
  await screen.findByTestId('roi-delta-f', {}, { timeout: 15_000 });
  await screen.findByRole('region', { name: "Computation's suggestion" }, { timeout: 15_000 });
}

// A whole screen renders slowly in jsdom on a shared 2-core machine.
describe('Review', { timeout: 60_000 }, () => {
  it('shows the caution, the results with units and two decimals, and draws every chart', async () => {
    await openReview('analyst');
    expect(screen.getByRole('note', { name: 'Research use caution' })).toBeInTheDocument();
    // −0.3125 Hz to two decimals (the rounding of Number.prototype.toFixed).
    expect(screen.getByTestId('roi-delta-f')).toHaveTextContent('\u22120.31 Hz');
    expect(await screen.findByTestId('rest-paf')).toHaveTextContent('PAF 10.24 Hz');
    expect(await drawnMarks('Onset curve')).toBe('rangeX area line lineX');
    expect(await drawnMarks('Rest spectrum')).toBe('rangeX line lineX lineX');
    // The raster painted one pixel per cell: 4 trials × 8 time points.
    await waitFor(() => expect(canvas.putImageData).toBeGreaterThan(0));
    expect(canvas.lastImage?.width).toBe(8);
    expect(canvas.lastImage?.height).toBe(4);
    expect(
      screen.getByRole('group', { name: 'Instantaneous frequency (Hz) colour legend' }),
    ).toHaveTextContent('8.0 Hz');
    // The header chip and the report card read the same sign-off answer.
    expect(await screen.findByTestId('report-state-chip')).toHaveTextContent(
      'Report: Draft, not signed yet',
    );
    expect(await screen.findByTestId('report-state-card')).toHaveTextContent(
      'Draft, not signed yet',
    );
  });

  it("gives the analyst the flag form and the visit's own choices, but no study-wide settings form", async () => {
    await openReview('analyst');
    const suggestion = screen.getByRole('region', { name: "Computation's suggestion" });
    expect(suggestion).toHaveTextContent('Suggests a slowing flag');
    const decision = screen.getByRole('region', { name: "Analyst's decision" });
    expect(decision).toHaveTextContent('No slowing flag has been raised');
    expect(screen.getByRole('button', { name: 'Raise a slowing flag' })).toBeInTheDocument();
    const choices = screen.getByLabelText('Visit analysis choices');
    expect(
      await within(choices).findByText(
        "This visit uses the study's settings (version 1): no choices of its own.",
      ),
    ).toBeInTheDocument();
    expect(
      within(choices).getByRole('button', { name: "Change this visit's choices" }),
    ).toBeInTheDocument();
    // The study-wide settings live on their own screen now.
    expect(within(choices).getByRole('link', { name: 'Study settings' })).toHaveAttribute(
      'href',
      '/study-settings',
    );
    expect(screen.queryByRole('form', { name: 'Analysis settings' })).not.toBeInTheDocument();
    // Every number says where it comes from, and nothing here is doubtful.
    expect(screen.getByTestId('source-task')).toHaveTextContent(
      'Task: the recording uploaded 3 Feb 2025, 10:00:00 (SHA-256 c0ffeec0ffee…), computed 3 Feb 2025, 10:05:00, once the file was accepted, settings version 1 (amplitude gate off; cross-check warning above 0.10 Hz; conditions compared: the first two found).',
    );
    // The run's own analysis-depth settings are part of its provenance, the rest run has none.
    expect(screen.getByTestId('source-resting')).not.toHaveTextContent('amplitude gate');
    // Dropped epochs are counted by reason, in words rather than the result's keys.
    expect(screen.getByText('1 amplitude beyond the rejection threshold')).toBeInTheDocument();
    expect(screen.queryByText(/left out/i)).not.toBeInTheDocument();
    expect(screen.queryByText(/No region-of-interest channel remains/)).not.toBeInTheDocument();
    expect(screen.queryByText(/Computed with older settings/)).not.toBeInTheDocument();
  });

  it('shows the monitor the same results read-only: no flag form, no settings form', async () => {
    const analyst = meFor('analyst').user;
    server.use(
      http.get(`/api/visits/${VISIT.id}/flag`, () =>
        HttpResponse.json({
          ...NO_FLAG,
          current: {
            id: 'flag-1',
            visitId: VISIT.id,
            state: 'raised',
            raisedById: analyst.id,
            raiseReason: 'Clear slowing over O1 and Pz',
            raisedAt: '2025-02-04T09:00:00.000Z',
            clearedById: null,
            clearReason: null,
            clearedAt: null,
          },
        }),
      ),
      http.get(`/api/users/${analyst.id}`, () => HttpResponse.json(analyst)),
    );
    await openReview('monitor', { keepFlag: true });
    // A monitor may read the study's users, so the decision names who made it.
    await waitFor(() =>
      expect(screen.getByRole('region', { name: "Analyst's decision" })).toHaveTextContent(
        `by ${analyst.name}`,
      ),
    );
    expect(screen.getByRole('region', { name: "Computation's suggestion" })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Raise a slowing flag' })).not.toBeInTheDocument();
    expect(screen.queryByRole('form', { name: 'Analysis settings' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /re-run/i })).not.toBeInTheDocument();
    expect(screen.queryByRole('textbox')).not.toBeInTheDocument();
    // The read-only card says which settings are in force, without a way to change them.
    expect(
      await screen.findByText(
        "This visit uses the study's settings (version 1): no choices of its own.",
      ),
    ).toBeInTheDocument();
    expect(
      screen.queryByRole('button', { name: "Change this visit's choices" }),
    ).not.toBeInTheDocument();
  });

  it('raises a flag with the reason and shows the decision the server answers', async () => {
    await openReview('analyst');
    let sent: unknown = null;
    server.use(
      http.post(`/api/visits/${VISIT.id}/flag/raise`, async ({ request }) => {
        sent = await request.json();
        return HttpResponse.json({
          ...NO_FLAG,
          current: {
            id: 'flag-1',
            visitId: VISIT.id,
            state: 'raised',
            raisedById: 'user-analyst',
            raiseReason: 'Clear slowing over O1 and Pz',
            raisedAt: '2025-02-04T09:00:00.000Z',
            clearedById: null,
            clearReason: null,
            clearedAt: null,
          },
        });
      }),
    );
    // Pasted, not typed key by key: each key re-renders the whole screen, slowly in jsdom.
    await userEvent.click(screen.getByLabelText('Why raise it?'));
    await userEvent.paste('Clear slowing over O1 and Pz');
    await userEvent.click(screen.getByRole('button', { name: 'Raise a slowing flag' }));
    const decision = screen.getByRole('region', { name: "Analyst's decision" });
    await waitFor(() => expect(decision).toHaveTextContent('Slowing flag raised'), {
      timeout: 10_000,
    });
    expect(decision).toHaveTextContent('Clear slowing over O1 and Pz');
    expect(sent).toEqual({ reason: 'Clear slowing over O1 and Pz' });
    expect(
      // The name may still carry the "loading" icon's label while the form settles.
      await screen.findByRole('button', { name: /Clear the flag$/ }, { timeout: 20_000 }),
    ).toBeInTheDocument();
  });

  it('shows an error with a retry that loads the visit once the server answers', async () => {
    serveVisit();
    server.use(
      http.get(
        `/api/visits/${VISIT.id}`,
        failingOnce(503, 'UNAVAILABLE', 'The database is busy.', () => HttpResponse.json(VISIT)),
      ),
    );
    renderApp(`/review/${VISIT.id}`, meFor('analyst'));
    expect(
      await screen.findByText('This visit could not be loaded', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    expect(screen.getByRole('alert')).toHaveTextContent('The database is busy.');
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(
      await screen.findByText(`Review · ${PARTICIPANT.code} · ${VISIT.label}`),
    ).toBeInTheDocument();
  });

  it('says one report state in the header chip and the card: a new revision after a sent one', async () => {
    serveVisit();
    const sent = {
      id: 'rev-1',
      revision: 1,
      state: 'sent',
      signerName: 'Ana Lyst',
      signedAt: '2025-03-01T10:00:00.000Z',
      meaning: SIGNATURE_MEANING,
    } as ReportSignOffView['revisions'][number];
    server.use(
      http.get(`/api/visits/${VISIT.id}/report`, () =>
        HttpResponse.json({ ...REPORT, state: 'sent' }),
      ),
      http.get(`/api/visits/${VISIT.id}/report/sign-off`, () =>
        HttpResponse.json({
          report: { ...REPORT, state: 'sent' },
          meaning: SIGNATURE_MEANING,
          draftFingerprint: 'f'.repeat(64),
          pendingRevision: 2,
          canSign: true,
          cannotSignReason: null,
          revisions: [sent],
        } satisfies ReportSignOffView),
      ),
    );
    renderApp(`/review/${VISIT.id}`, meFor('analyst'));
    const words = 'Revision 2 awaits signing (revision 1 sent)';
    expect(
      await screen.findByTestId('report-state-chip', {}, { timeout: 15_000 }),
    ).toHaveTextContent(`Report: ${words}`);
    expect(
      await screen.findByTestId('report-state-card', {}, { timeout: 15_000 }),
    ).toHaveTextContent(words);
    expect(screen.queryByText(/Report: sent/)).not.toBeInTheDocument();
  });

  it('shows one state notice per recording while it is computed again', async () => {
    serveReview({
      recordings: [
        { ...recording('task', 'run-task'), state: 'queued' },
        { ...recording('resting', 'run-rest'), state: 'computing', progressPercent: 40 },
      ],
    });
    renderApp(`/review/${VISIT.id}`, meFor('analyst'));
    const task = await screen.findByLabelText('Task results', {}, { timeout: 15_000 });
    await within(task).findByTestId('roi-delta-f', {}, { timeout: 15_000 });
    const notices = within(task).getAllByRole('status', { name: 'Recording state' });
    expect(notices).toHaveLength(1);
    expect(notices[0]).toHaveTextContent(
      'Waiting for its turn to be computed again; the previous results stay below until then.',
    );
    expect(task).not.toHaveTextContent('Computing again');
    const rest = screen.getByLabelText('Rest results');
    await waitFor(() =>
      expect(within(rest).getAllByRole('status', { name: 'Recording state' })).toHaveLength(1),
    );
    expect(
      within(rest)
        .getByRole('status', { name: 'Recording state' })
        .textContent?.replace(/\s/g, ' '),
    ).toContain('Computing again: 40 % done; these are the previous results.');
  });

  it('says a missing visit does not exist, with a way back and no "Try again"', async () => {
    serveVisit();
    server.use(
      http.get(`/api/visits/${VISIT.id}`, () => errorResponse(404, 'VISIT_NOT_FOUND', 'No visit.')),
    );
    renderApp(`/review/${VISIT.id}`, meFor('analyst'));
    expect(
      await screen.findByText(
        'This visit does not exist or you cannot open it',
        {},
        { timeout: 15_000 },
      ),
    ).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Back to the start' })).toHaveAttribute('href', '/');
    expect(screen.getByRole('note', { name: 'Research use caution' })).toBeInTheDocument();
  });

  it('is not available to a technician, who may not see results', async () => {
    renderApp(`/review/${VISIT.id}`, meFor('technician'));
    expect(await screen.findByText(/not available/i, {}, { timeout: 15_000 })).toBeInTheDocument();
  });
});
