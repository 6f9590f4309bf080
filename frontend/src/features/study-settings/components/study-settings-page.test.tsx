import type { AnalysisSettingsChange, AnalysisSettingsView, Page } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { PHONE_WIDTH_PX, setViewportWidth } from '../../../test/viewport';
import { serveSchedule } from '../testing/schedule-fixtures';
import { VERSION_1, VERSION_2 } from '../testing/settings-fixtures';
import { errorResponse } from '../../../test/error-response';

installMswServer();

const base = `/api/studies/${STUDY.id}/analysis-settings`;
const page = (items: AnalysisSettingsView[]): Page<AnalysisSettingsView> => ({
  items,
  total: items.length,
  page: 1,
  pageSize: 10,
});

/** The study's settings as the server holds them; POSTs answer with `answer`. */
function serveSettings(answer?: (change: AnalysisSettingsChange) => Response) {
  const state = { versions: [VERSION_2, VERSION_1], posted: [] as AnalysisSettingsChange[] };
  serveSchedule();
  server.use(
    http.get(base, () => HttpResponse.json(state.versions[0])),
    http.get(`${base}/versions`, ({ request }) => {
      const search = new URL(request.url).searchParams;
      expect(search.get('order')).toBe('desc');
      return HttpResponse.json(page(state.versions));
    }),
    http.post(base, async ({ request }) => {
      const change = (await request.json()) as AnalysisSettingsChange;
      state.posted.push(change);
      if (answer === undefined) throw new Error('No POST expected');
      return answer(change);
    }),
  );
  return state;
}

async function openSettings(role: 'analyst' | 'monitor') {
  renderApp('/study-settings', meFor(role));
  return screen.findByRole('region', { name: 'Version 2' }, { timeout: 15_000 });
}

describe('Study settings', { timeout: 60_000 }, () => {
  it('lists every version with its reason and its changes as before → after with units', async () => {
    serveSettings();
    const version2 = await openSettings('analyst');
    expect(screen.getByRole('note', { name: 'Research use caution' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Study settings' })).toBeInTheDocument();
    expect(version2).toHaveTextContent('Later post window after the pilot review');
    expect(version2).toHaveTextContent('current');
    expect(version2).toHaveTextContent('by you');
    const changes = within(version2).getByRole('list', { name: 'Changes in version 2' });
    expect(
      within(changes)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual([
      "Alpha band: visit's IAF ± 2 Hz (8–13 Hz without one) → 8.00 to 12.00 Hz",
      'Post window: 0.20 to 0.80 s → 0.30 to 0.90 s',
    ]);
    const version1 = screen.getByRole('region', { name: 'Version 1' });
    expect(version1).toHaveTextContent("The study's first settings.");
    expect(version1).toHaveTextContent("by Gyre (the study's starting settings)");
    expect(version1).not.toHaveTextContent('current');
    expect(screen.getByLabelText('Current settings')).toHaveTextContent('0.30 to 0.90 s');
  });

  it('shows "Nothing changed" when the server says the new version equals the current one', async () => {
    const state = serveSettings(() =>
      errorResponse(409, 'ANALYSIS_SETTINGS_UNCHANGED', 'Nothing differs from version 2.', {
        version: 2,
      }),
    );
    await openSettings('analyst');
    const form = screen.getByRole('form', { name: 'Analysis settings' });
    await userEvent.click(within(form).getByLabelText('Reason for the change'));
    await userEvent.paste('Checking the settings again');
    await userEvent.click(within(form).getByRole('button', { name: 'Save version 3' }));
    const alert = await within(form).findByRole('alert');
    expect(alert).toHaveTextContent('Nothing changed');
    expect(alert).toHaveTextContent('Nothing differs from version 2.');
    expect(state.posted).toHaveLength(1);
    expect(state.posted[0]).toMatchObject({
      postWindowS: [0.3, 0.9],
      bandHz: [8, 12],
      reason: 'Checking the settings again',
    });
    // Still version 2: nothing was saved.
    expect(screen.getByLabelText('Current settings')).toHaveTextContent(
      'Current settings: version 2',
    );
  });

  it('saves a new version and shows it at the top of the list', async () => {
    const state = serveSettings((change) => {
      const { reason, ...values } = change;
      const created: AnalysisSettingsView = {
        ...VERSION_2,
        ...values,
        id: 'set-3',
        version: 3,
        reason,
        changes: [{ field: 'rejectionThresholdUv', before: 100, after: 150 }],
        createdAt: '2025-04-01T08:00:00.000Z',
      };
      state.versions = [created, ...state.versions];
      return HttpResponse.json(created, { status: 201 });
    });
    await openSettings('analyst');
    const form = screen.getByRole('form', { name: 'Analysis settings' });
    const threshold = within(form).getByLabelText('Reject epochs above');
    await userEvent.clear(threshold);
    await userEvent.paste('150');
    await userEvent.click(within(form).getByLabelText('Reason for the change'));
    await userEvent.paste('Fewer epochs dropped at site North');
    await userEvent.click(within(form).getByRole('button', { name: 'Save version 3' }));
    const version3 = await screen.findByRole('region', { name: 'Version 3' });
    expect(version3).toHaveTextContent('Reject epochs above: 100 µV → 150 µV');
    expect(version3).toHaveTextContent('current');
    await waitFor(() =>
      expect(screen.getByRole('region', { name: 'Version 2' })).not.toHaveTextContent('current'),
    );
    expect(state.posted[0].rejectionThresholdUv).toBe(150);
    expect(
      await screen.findByRole('button', { name: 'Save version 4' }, { timeout: 10_000 }),
    ).toBeInTheDocument();
  });

  it('shows a monitor the versions read-only, naming who saved each', async () => {
    serveSettings();
    const analyst = meFor('analyst').user;
    server.use(http.get(`/api/users/${analyst.id}`, () => HttpResponse.json(analyst)));
    const version2 = await openSettings('monitor');
    await waitFor(() => expect(version2).toHaveTextContent(`by ${analyst.name}`));
    expect(screen.queryByRole('form', { name: 'Analysis settings' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Save version/ })).not.toBeInTheDocument();
    expect(screen.getByText(/Read-only/)).toBeInTheDocument();
  });

  it('shows the visit schedule, groups and trend settings read-only', async () => {
    serveSettings();
    await openSettings('monitor');
    const schedule = await screen.findByRole('region', { name: 'Visit schedule' });
    const rows = await within(schedule).findAllByRole('row');
    expect(rows.slice(1).map((row) => row.textContent)).toEqual([
      'Baselineday 0up to 7 days after',
      'Week 12day 84−14 / +14 days',
      'Week 26day 182−14 / +14 days',
    ]);
    expect(within(schedule).queryByRole('button', { name: 'Add planned visit' })).toBeNull();
    const groups = screen.getByRole('region', { name: 'Groups' });
    expect(await within(groups).findByText('Arm A')).toBeInTheDocument();
    expect(within(groups).queryByRole('button', { name: /Delete/ })).toBeNull();
    const trend = screen.getByRole('region', { name: 'Trend settings' });
    expect(trend).toHaveTextContent('Visits needed for a trend3 visits');
    expect(trend).toHaveTextContent('Days those visits must span90 days');
    expect(within(trend).queryByRole('button')).toBeNull();
  });

  it('lays the current settings out one per line at phone width', async () => {
    setViewportWidth(PHONE_WIDTH_PX);
    serveSettings();
    await openSettings('analyst');
    const rows = within(screen.getByLabelText('Current settings')).getAllByRole('row');
    // Version, twelve settings (no wavelet cycles for the band-pass; the last three are the
    // amplitude gate, the cross-check's threshold and the compared conditions) and the reason.
    expect(rows).toHaveLength(14);
  });

  it('is not open to a technician', async () => {
    renderApp('/study-settings', meFor('technician'));
    expect(await screen.findByText(/not available/i, {}, { timeout: 15_000 })).toBeInTheDocument();
  });
});
