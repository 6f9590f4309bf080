import { screen, within } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { describe, expect, it, vi } from 'vitest';
import { drawnMarks } from '../../../components/charts/testing/drawn-marks';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import {
  GROUPS,
  PARTICIPANT,
  TRAJECTORY,
  TRAJECTORY_TOO_FEW,
  VISITS,
} from '../testing/participant-fixtures';
import { errorResponse } from '../../../test/error-response';

// jsdom has no canvas for the chart library: a stand-in shows which marks would be drawn.
vi.mock(
  '../../../components/charts/g2-plot',
  () => import('../../../components/charts/testing/fake-g2-plot'),
);

installMswServer();

function serve() {
  server.use(
    http.get(`/api/participants/${PARTICIPANT.id}`, () => HttpResponse.json(PARTICIPANT)),
    http.get(`/api/studies/${PARTICIPANT.studyId}/groups`, () => HttpResponse.json(GROUPS)),
    http.get(`/api/participants/${PARTICIPANT.id}/trajectory`, () => HttpResponse.json(TRAJECTORY)),
    http.get('/api/visits', ({ request }) => {
      expect(new URL(request.url).searchParams.get('participantId')).toBe(PARTICIPANT.id);
      return HttpResponse.json({ items: VISITS, total: VISITS.length, page: 1, pageSize: 200 });
    }),
  );
}

describe('Participant trajectory', { timeout: 60_000 }, () => {
  it('draws PAF, CoG and Δf with trends and flagged visits, and links every visit to Review', async () => {
    serve();
    renderApp(`/participants/${PARTICIPANT.id}`, meFor('monitor'));
    expect(
      await screen.findByText('Participant AC-0042', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    expect(screen.getByRole('note', { name: 'Research use caution' })).toBeInTheDocument();

    // Two visits have values: line, points and trend per series, and the flagged visit's line.
    expect(await drawnMarks('Alpha frequency trajectory')).toBe(
      'lineX line point line line point line',
    );
    expect(await drawnMarks('Onset change trajectory')).toBe('lineX lineY line point line');
    expect(
      screen.getByText('PAF (\u22120.40 Hz/year over 2 visits (184 days))'),
    ).toBeInTheDocument();

    const rows = within(screen.getByRole('table', { name: 'Visits' })).getAllByRole('row');
    expect(rows).toHaveLength(4);
    // Hz to two decimals; the first visit is where the change is measured from.
    expect(rows[1]).toHaveTextContent('10.30 Hzfirst value');
    expect(rows[2]).toHaveTextContent('10.10 Hz\u22120.20 Hz');
    expect(rows[2]).toHaveTextContent('\u22120.25 Hz\u22120.15 Hz');
    expect(within(rows[2]).getByText('flagged')).toBeInTheDocument();
    // A doubtful number says so in its row; the first visit has nothing in doubt.
    expect(within(rows[1]).getByText('nothing')).toBeInTheDocument();
    expect(within(rows[2]).getByRole('list', { name: 'Doubts about Month 6' })).toHaveTextContent(
      'left out: EEG Pz-REF (saturated)',
    );
    // The third visit has no results yet but still opens in Review.
    expect(rows[3]).toHaveTextContent('Month 12');
    expect(within(rows[3]).getByRole('link', { name: 'Review Month 12' })).toHaveAttribute(
      'href',
      '/review/v-3',
    );
    expect(within(rows[1]).getByRole('link', { name: 'Review Baseline' })).toHaveAttribute(
      'href',
      '/review/v-1',
    );
  });

  it('shows the enrolment date, the group and each visit against its window, marking the late one', async () => {
    serve();
    renderApp(`/participants/${PARTICIPANT.id}`, meFor('analyst'));
    const enrolment = await screen.findByLabelText('Enrolment', {}, { timeout: 15_000 });
    expect(enrolment).toHaveTextContent('Enrolment date10 Jan 2024');
    expect(await within(enrolment).findByText('Arm B')).toBeInTheDocument();
    const rows = within(screen.getByRole('table', { name: 'Visits' })).getAllByRole('row');
    // Enrolled 2024-01-10: 2024-07-12 is day 184, 2025-01-15 day 371 (through 29 February 2024;
    // Python: date(2025, 1, 15) - date(2024, 1, 10) = 371 days). Month 12 allows 365 ± 3.
    expect(rows[1]).toHaveTextContent('In window');
    expect(rows[1]).toHaveTextContent('Day 0 (target 0)');
    expect(rows[2]).toHaveTextContent('Day 184 (target 182)');
    expect(within(rows[3]).getByLabelText('Schedule: Late by 6 days')).toBeInTheDocument();
    expect(rows[3]).toHaveTextContent('Day 371 (target 365)');
  });

  it("draws no trend line where the study's rule gives no slope, and says why in words", async () => {
    serve();
    server.use(
      http.get(`/api/participants/${PARTICIPANT.id}/trajectory`, () =>
        HttpResponse.json(TRAJECTORY_TOO_FEW),
      ),
    );
    renderApp(`/participants/${PARTICIPANT.id}`, meFor('analyst'));
    // Line and points per series, no dashed trend line.
    expect(await drawnMarks('Alpha frequency trajectory')).toBe('lineX line point line point');
    expect(
      screen.getByText('PAF (no trend: 2 visits with a value, the study needs 3)'),
    ).toBeInTheDocument();
    expect(screen.queryByText('Theil–Sen trend')).toBeNull();
    expect(screen.getAllByText('no trend: 2 visits with a value, the study needs 3')).toHaveLength(
      3,
    );
  });

  it('shows an empty trajectory in words when no visit has results', async () => {
    serve();
    server.use(
      http.get(`/api/participants/${PARTICIPANT.id}/trajectory`, () =>
        HttpResponse.json({
          ...TRAJECTORY,
          visits: [],
          slopesHzPerYear: { paf: null, cog: null, deltaF: null },
        }),
      ),
    );
    renderApp(`/participants/${PARTICIPANT.id}`, meFor('analyst'));
    expect(
      await screen.findByText(
        'No visit has computed results yet, so there is no trajectory to draw.',
        {},
        { timeout: 15_000 },
      ),
    ).toBeInTheDocument();
  });

  it("explains a participant's page closed by blinded review instead of failing", async () => {
    serve();
    server.use(
      http.get(`/api/participants/${PARTICIPANT.id}`, () =>
        errorResponse(403, 'BLINDING_PARTICIPANT_BLINDED', 'Blinded review is on for this study'),
      ),
    );
    renderApp(`/participants/${PARTICIPANT.id}`, meFor('analyst'));
    const notice = await screen.findByRole(
      'note',
      { name: 'Closed during blinded review' },
      { timeout: 15_000 },
    );
    expect(notice).toHaveTextContent("This participant's page is closed to you");
    expect(notice).toHaveTextContent('opens once you have recorded your decision');
    expect(screen.queryByText(PARTICIPANT.code)).toBeNull();
  });
});
