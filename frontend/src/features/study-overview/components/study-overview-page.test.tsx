import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it, vi } from 'vitest';
import { drawnMarks } from '../../../components/charts/testing/drawn-marks';
import { meFor, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { OVERVIEW } from '../testing/overview-fixtures';
import { errorResponse } from '../../../test/error-response';

// jsdom has no canvas for the chart library: a stand-in shows which marks would be drawn.
vi.mock(
  '../../../components/charts/g2-plot',
  () => import('../../../components/charts/testing/fake-g2-plot'),
);

installMswServer();

function serve(body = OVERVIEW) {
  const asked: string[] = [];
  server.use(
    http.get('/api/studies/:studyId/overview', ({ params }) => {
      asked.push(params.studyId as string);
      return HttpResponse.json(body);
    }),
  );
  return asked;
}

describe('Study overview', { timeout: 60_000 }, () => {
  it('draws group means with CIs over faint courses, switches to sites, and says each state in words', async () => {
    const asked = serve();
    renderApp('/study-overview', meFor('monitor'));
    expect(
      await screen.findByText('Courses over the planned visits', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    expect(asked).toEqual([STUDY.id]);
    expect(
      screen.getAllByRole('note', { name: 'Research use caution' }).length,
    ).toBeGreaterThanOrEqual(1);
    expect(screen.getByRole('region', { name: 'Results exports' })).toBeInTheDocument();
    expect(screen.getByRole('list', { name: 'About these numbers' })).toHaveTextContent(
      '1 visit used the 8–13 Hz band',
    );

    // PAF by group: faint courses, then Arm 1 with a CI band, line and points (Arm 2 has no mean).
    expect(await drawnMarks('Peak alpha frequency at rest by group')).toBe('line area line point');
    const means = screen.getByRole('table', { name: 'Means by group' });
    expect(within(means).getAllByRole('row')[1]).toHaveTextContent(
      'Arm 1Baseline10.00 Hz (7.46 to 12.54; n = 2, 1 doubtful)',
    );
    expect(within(means).getAllByRole('row')[2]).toHaveTextContent('10.00 Hz (no CI; n = 1)');

    await userEvent.setup().click(screen.getByText('By site'));
    expect(
      await screen.findByRole('figure', { name: 'Peak alpha frequency at rest by site' }),
    ).toBeInTheDocument();
    expect(screen.getByRole('table', { name: 'Means by site' })).toHaveTextContent('North clinic');

    const matrix = screen.getByRole('table', { name: 'Completion matrix' });
    const rows = within(matrix).getAllByRole('row');
    expect(rows[0]).toHaveTextContent('Baselineday 0 · 3 of 3 present');
    expect(rows[0]).toHaveTextContent('Month 6day 182 · 1 of 3 present');
    expect(rows[1]).toHaveTextContent('AC-0001North clinic · Arm 1');
    expect(rows[1]).toHaveTextContent('signed');
    expect(rows[1]).toHaveTextContent('computedchanged since signing');
    expect(rows[2]).toHaveTextContent('reviewed1 doubt');
    expect(rows[2]).toHaveTextContent('missing');
    expect(rows[3]).toHaveTextContent('uploaded');

    const quality = screen.getByRole('table', { name: 'Site quality' });
    const north = within(quality).getAllByRole('row')[1];
    expect(north).toHaveTextContent('25.0 % (2 of 8)');
    expect(north).toHaveTextContent('12.5 %');
    expect(north).toHaveTextContent('1.80 / 1.02');
    expect(north).toHaveTextContent('3.1 %');
    expect(north).toHaveTextContent('0.4 per run · 1 without any');
    expect(within(quality).getAllByRole('row')[2]).toHaveTextContent('South clinic0.0 % (0 of 1)');
  });

  it('lets an admin choose the study first', async () => {
    const asked = serve();
    server.use(
      http.get('/api/studies', () =>
        HttpResponse.json({
          items: [STUDY, { ...STUDY, id: 'study-2', code: 'BETA', name: 'Beta' }],
          total: 2,
          page: 1,
          pageSize: 100,
        }),
      ),
    );
    renderApp('/study-overview', meFor('admin'));
    expect(
      await screen.findByText('Choose a study to see its overview.', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    const user = userEvent.setup();
    await user.click(screen.getByRole('combobox', { name: 'Study' }));
    await user.click(await screen.findByText('BETA · Beta'));
    await waitFor(() => expect(asked).toEqual(['study-2']));
    expect(await screen.findByRole('table', { name: 'Completion matrix' })).toBeInTheDocument();
  });

  it('says so when the study has no planned visits', async () => {
    serve({ ...OVERVIEW, plannedVisits: [], participants: [], byGroup: [], bySite: [] });
    renderApp('/study-overview', meFor('analyst'));
    expect(
      await screen.findByText(
        'The study has no planned visits yet, so there is no course to draw.',
        {},
        { timeout: 15_000 },
      ),
    ).toBeInTheDocument();
  });

  it('tells a blinded analyst why the overview and its exports are closed', async () => {
    server.use(
      http.get('/api/studies/:studyId/overview', () =>
        errorResponse(
          403,
          'BLINDING_STUDY_CLOSED',
          'Blinded review is on for this study: the study overview is closed to analysts',
        ),
      ),
    );
    renderApp('/study-overview', meFor('analyst'));
    const notice = await screen.findByRole(
      'note',
      { name: 'Closed during blinded review' },
      { timeout: 15_000 },
    );
    expect(notice).toHaveTextContent('closed to you while blinded review is on');
    expect(notice).toHaveTextContent('Your worklist and Review stay open');
    expect(screen.queryByRole('region', { name: 'Results exports' })).toBeNull();
    expect(screen.queryByRole('button', { name: /retry/i })).toBeNull();
  });

  it('is not open to technicians', async () => {
    renderApp('/study-overview', meFor('technician'));
    expect(
      await screen.findByText(/not available for your role/i, {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
  });
});
