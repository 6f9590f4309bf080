import type { CalibrationRunView, Role } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { DEFAULT_SETTINGS, meFor, SITE, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';

installMswServer();

// The start page's worklist is another feature's; here it answers an empty one.
const EMPTY_WORKLIST = {
  kind: 'review',
  readOnly: false,
  sort: 'oldest',
  limit: 8,
  offset: 0,
  generatedAt: '2026-03-02T10:00:00.000Z',
  sections: [],
};

// Generated test data: one run of the calibration signal, values as a passing run gives them.
function run(state: CalibrationRunView['state'], extra: Partial<CalibrationRunView> = {}) {
  const finished = state === 'passed' || state === 'failed';
  return {
    id: `run-${state}`,
    studyId: STUDY.id,
    siteId: SITE.id,
    siteCode: SITE.code,
    state,
    signalName: 'Gyre calibration signal 1',
    checks: finished
      ? [
          {
            key: 'restPafHz',
            unit: 'Hz',
            expected: 10,
            computed: 9.9998,
            tolerance: 0.125,
            passed: true,
          },
          {
            key: 'taskBaselineHz',
            unit: 'Hz',
            expected: 10,
            computed: 10.0026,
            tolerance: 0.125,
            passed: true,
          },
          {
            key: 'taskDeltaFHz',
            unit: 'Hz',
            expected: -0.5,
            computed: state === 'failed' ? -0.032 : -0.5034,
            tolerance: 0.052,
            passed: state !== 'failed',
          },
          {
            key: 'taskTrialsKept',
            unit: 'trials',
            expected: 29,
            computed: 29,
            tolerance: 0,
            passed: true,
          },
        ]
      : [],
    error: null,
    gyreVersion: '0.1.0',
    settingsVersionId: 'settings-2',
    settingsVersion: 2,
    settings: DEFAULT_SETTINGS,
    requestedById: 'user-technician',
    requestedByName: 'Tomas Tech',
    requestedAt: '2026-03-02T09:00:00.000Z',
    finishedAt: finished ? '2026-03-02T09:00:20.000Z' : null,
    ...extra,
  } satisfies CalibrationRunView;
}

function serve(latest: () => CalibrationRunView[]) {
  const started: string[] = [];
  server.use(
    http.get('/api/sites', () =>
      HttpResponse.json({ items: [SITE], total: 1, page: 1, pageSize: 100 }),
    ),
    http.get('/api/calibration-runs/latest', () => HttpResponse.json(latest())),
    http.post('/api/sites/:siteId/calibration-runs', ({ params }) => {
      started.push(params.siteId as string);
      return HttpResponse.json(run('queued'), { status: 201 });
    }),
  );
  return started;
}

describe('Site check', { timeout: 60_000 }, () => {
  it("lets a technician run their site's calibration and shows each value when it passes", async () => {
    let current: CalibrationRunView[] = [];
    const started = serve(() => current);
    renderApp('/site-check', meFor('technician'));
    const card = (
      await screen.findByText(`${SITE.code} · ${SITE.name}`, {}, { timeout: 15_000 })
    ).closest('.ant-card') as HTMLElement;
    expect(within(card).getByText(/No calibration run yet/)).toBeInTheDocument();
    current = [run('passed')];
    await userEvent.setup().click(within(card).getByRole('button', { name: 'Run calibration' }));
    await waitFor(() => expect(started).toEqual([SITE.id]));
    const table = await screen.findByRole('table', {
      name: `Calibration values of site ${SITE.code}`,
    });
    const rows = within(table).getAllByRole('row');
    // True minus (U+2212) and a no-break space before the unit (shared number-format.ts).
    expect(rows[1].textContent).toContain(
      'Resting peak alpha frequency10.000\u00A0Hz10.000\u00A0Hz±0.125\u00A0Hzwithin',
    );
    expect(rows[3].textContent).toContain(
      '\u22120.500\u00A0Hz\u22120.503\u00A0Hz±0.052\u00A0Hzwithin',
    );
    expect(rows[4]).toHaveTextContent('Task: onsets kept2929exactwithin');
    expect(within(card).getByText('Passed')).toBeInTheDocument();
    expect(within(card).getByText('version 2')).toBeInTheDocument();
    expect(within(card).getByText('Tomas Tech')).toBeInTheDocument();
  });

  it('shows an analyst a failed run, with the value outside, and offers no run button', async () => {
    serve(() => [run('failed')]);
    renderApp('/site-check', meFor('analyst'));
    const alert = await screen.findByText(
      `The calibration of site ${SITE.code} failed`,
      {},
      { timeout: 15_000 },
    );
    expect(alert).toBeInTheDocument();
    const table = screen.getByRole('table', { name: `Calibration values of site ${SITE.code}` });
    expect(within(table).getAllByRole('row')[3].textContent).toContain(
      '\u22120.032\u00A0Hz±0.052\u00A0Hzoutside',
    );
    expect(screen.queryByRole('button', { name: 'Run calibration' })).toBeNull();
  });

  it.each<Role>(['analyst', 'monitor'])(
    'tells a %s on the start page that a calibration failed',
    async (role) => {
      serve(() => [run('failed')]);
      server.use(http.get('/api/worklist', () => HttpResponse.json(EMPTY_WORKLIST)));
      renderApp('/', meFor(role));
      const notice = await screen.findByRole('alert', {}, { timeout: 15_000 });
      expect(notice).toHaveTextContent(`The newest calibration run of site ${SITE.code} failed`);
      expect(within(notice).getByRole('link', { name: 'Site check' })).toHaveAttribute(
        'href',
        '/site-check',
      );
    },
  );

  it('says nothing on the start page when the newest runs passed', async () => {
    let asked = 0;
    serve(() => {
      asked += 1;
      return [run('passed')];
    });
    server.use(http.get('/api/worklist', () => HttpResponse.json(EMPTY_WORKLIST)));
    renderApp('/', meFor('analyst'));
    await screen.findByRole('region', { name: 'Worklist' }, { timeout: 15_000 });
    await waitFor(() => expect(asked).toBeGreaterThan(0));
    expect(screen.queryByRole('alert')).toBeNull();
    expect(screen.queryByText(/calibration run of site/)).toBeNull();
  });
});
