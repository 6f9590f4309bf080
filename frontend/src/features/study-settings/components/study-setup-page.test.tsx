import type { PlannedVisitView, StudyView } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { PHONE_WIDTH_PX, setViewportWidth } from '../../../test/viewport';
import { GROUPS, PLANNED_VISITS, serveSchedule } from '../testing/schedule-fixtures';
import { errorResponse } from '../../../test/error-response';

installMswServer();

const base = `/api/studies/${STUDY.id}`;

/** One study, its schedule (writable) and groups, as the server holds them for an admin. */
function serveSetup() {
  const state = {
    planned: [...PLANNED_VISITS],
    study: { ...STUDY } as StudyView,
    posted: [] as unknown[],
    patched: [] as unknown[],
  };
  serveSchedule(state.planned, GROUPS);
  server.use(
    http.get('/api/studies', () =>
      HttpResponse.json({ items: [state.study], total: 1, page: 1, pageSize: 100 }),
    ),
    http.get(base, () => HttpResponse.json(state.study)),
    http.patch(base, async ({ request }) => {
      const body = (await request.json()) as Partial<StudyView>;
      state.patched.push(body);
      state.study = { ...state.study, ...body, updatedAt: '2025-05-01T10:00:00.000Z' };
      return HttpResponse.json(state.study);
    }),
    http.get(`${base}/planned-visits`, () => HttpResponse.json(state.planned)),
    http.post(`${base}/planned-visits`, async ({ request }) => {
      const body = (await request.json()) as Omit<PlannedVisitView, 'id'>;
      state.posted.push(body);
      const created = { ...PLANNED_VISITS[0], ...body, id: 'pv-52' };
      state.planned = [...state.planned, created];
      return HttpResponse.json(created, { status: 201 });
    }),
    http.delete(`${base}/planned-visits/pv-12`, () =>
      errorResponse(
        409,
        'PLANNED_VISIT_IN_USE',
        'Planned visit Week 12 is in use: 2 visit(s) were registered on it (AC-0001, AC-0002)',
      ),
    ),
  );
  return state;
}

describe('Study set-up (admin)', { timeout: 60_000 }, () => {
  it('adds a planned visit to the schedule', async () => {
    const state = serveSetup();
    renderApp('/study-setup', meFor('admin'));
    const schedule = await screen.findByRole(
      'region',
      { name: 'Visit schedule' },
      { timeout: 15_000 },
    );
    expect(await within(schedule).findByText('Week 26')).toBeInTheDocument();
    await userEvent.click(within(schedule).getByRole('button', { name: 'Add planned visit' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save planned visit' }));
    expect(await within(dialog).findByText('Give the planned visit a name.')).toBeInTheDocument();
    await userEvent.type(within(dialog).getByLabelText('Name'), ' Week 52 ');
    await userEvent.type(within(dialog).getByLabelText('Target day after enrolment'), '364');
    const before = within(dialog).getByLabelText('Window before');
    await userEvent.clear(before);
    await userEvent.type(before, '28');
    const after = within(dialog).getByLabelText('Window after');
    await userEvent.clear(after);
    await userEvent.type(after, '28');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Save planned visit' }));
    await waitFor(() =>
      expect(state.posted).toEqual([
        { name: 'Week 52', targetDay: 364, windowBeforeDays: 28, windowAfterDays: 28, position: 3 },
      ]),
    );
    expect(await within(schedule).findByText('Week 52')).toBeInTheDocument();
    expect(within(schedule).getByText('−28 / +28 days')).toBeInTheDocument();
  });

  it("says why a planned visit in use cannot be deleted, in the server's words", async () => {
    serveSetup();
    renderApp('/study-setup', meFor('admin'));
    const schedule = await screen.findByRole(
      'region',
      { name: 'Visit schedule' },
      { timeout: 15_000 },
    );
    await userEvent.click(await within(schedule).findByRole('button', { name: 'Delete Week 12' }));
    await userEvent.click(await screen.findByRole('button', { name: 'Delete' }));
    expect(
      await screen.findByText(
        'Planned visit Week 12 is in use: 2 visit(s) were registered on it (AC-0001, AC-0002)',
      ),
    ).toBeInTheDocument();
    expect(within(schedule).getByText('Week 12')).toBeInTheDocument();
  });

  it('changes the trend settings and refuses fewer than two visits', async () => {
    const state = serveSetup();
    renderApp('/study-setup', meFor('admin'));
    const trend = await screen.findByRole(
      'region',
      { name: 'Trend settings' },
      { timeout: 15_000 },
    );
    const visits = within(trend).getByLabelText('Visits needed for a trend');
    await userEvent.clear(visits);
    await userEvent.type(visits, '1');
    await userEvent.click(within(trend).getByRole('button', { name: 'Save trend settings' }));
    expect(await within(trend).findByText('From 2 to 50 visits.')).toBeInTheDocument();
    expect(state.patched).toEqual([]);
    await userEvent.clear(visits);
    await userEvent.type(visits, '4');
    const span = within(trend).getByLabelText('Days those visits must span');
    await userEvent.clear(span);
    await userEvent.type(span, '180');
    await userEvent.click(within(trend).getByRole('button', { name: 'Save trend settings' }));
    await waitFor(() =>
      expect(state.patched).toEqual([{ trendMinVisits: 4, trendMinSpanDays: 180 }]),
    );
  });

  it('turns blinded review on only with a reason', async () => {
    const state = serveSetup();
    renderApp('/study-setup', meFor('admin'));
    const section = await screen.findByRole(
      'region',
      { name: 'Blinded review' },
      { timeout: 15_000 },
    );
    const save = within(section).getByRole('button', { name: 'Save blinded review' });
    expect(save).toBeDisabled();
    await userEvent.click(within(section).getByRole('switch'));
    await userEvent.click(save);
    expect(await within(section).findByText('Give a reason.')).toBeInTheDocument();
    expect(state.patched).toEqual([]);
    await userEvent.click(within(section).getByLabelText('Reason for the change'));
    await userEvent.paste('Analysts must not know the arm');
    await userEvent.click(save);
    await waitFor(() =>
      expect(state.patched).toEqual([
        { blindedReview: true, reason: 'Analysts must not know the arm' },
      ]),
    );
    expect(await within(section).findByRole('switch')).toBeChecked();
  });

  it('keeps the schedule readable at phone width', async () => {
    setViewportWidth(PHONE_WIDTH_PX);
    serveSetup();
    renderApp('/study-setup', meFor('admin'));
    const groups = await screen.findByRole('region', { name: 'Groups' }, { timeout: 15_000 });
    await within(groups).findByText('Arm A');
    // The description column gives way on a phone; name and actions stay.
    expect(
      within(groups)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['Group', 'Actions']);
  });

  it('is not open to an analyst', async () => {
    renderApp('/study-setup', meFor('analyst'));
    expect(await screen.findByText(/not available/i, {}, { timeout: 15_000 })).toBeInTheDocument();
  });
});
