import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor, SITE } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { PHONE_WIDTH_PX, setViewportWidth } from '../../../test/viewport';
import { GROUPS, participant } from '../testing/participant-fixtures';

installMswServer();

const OTHER_SITE = { ...SITE, id: 'site-b', code: 'SOUTH', name: 'South clinic' };
// Generated test data: 45 participants, every fifth at the second site.
const ALL = Array.from({ length: 45 }, (_, i) => ({
  ...participant(i + 1),
  siteId: (i + 1) % 5 === 0 ? OTHER_SITE.id : SITE.id,
}));

/** A stand-in for the server's list: it filters, sorts and pages as the query asks. */
function serveGroups() {
  server.use(http.get(`/api/studies/${SITE.studyId}/groups`, () => HttpResponse.json(GROUPS)));
}

function serveParticipants(requests: URLSearchParams[]) {
  serveGroups();
  server.use(
    http.get('/api/sites', () =>
      HttpResponse.json({ items: [SITE, OTHER_SITE], total: 2, page: 1, pageSize: 200 }),
    ),
    http.get('/api/participants', ({ request }) => {
      const query = new URL(request.url).searchParams;
      requests.push(query);
      const q = query.get('q') ?? '';
      const siteId = query.get('siteId');
      const order = query.get('order') === 'desc' ? -1 : 1;
      const page = Number(query.get('page'));
      const pageSize = Number(query.get('pageSize'));
      const found = ALL.filter(
        (p) => p.code.includes(q) && (siteId === null || p.siteId === siteId),
      ).sort((a, b) => order * a.code.localeCompare(b.code));
      return HttpResponse.json({
        items: found.slice((page - 1) * pageSize, page * pageSize),
        total: found.length,
        page,
        pageSize,
      });
    }),
  );
}

function codesShown(): string[] {
  const table = screen.getByRole('table');
  return within(table)
    .queryAllByRole('link')
    .map((link) => link.textContent ?? '');
}

describe('Participants', { timeout: 60_000 }, () => {
  it('lists participants with the caution and lets the server sort, page and search', async () => {
    const requests: URLSearchParams[] = [];
    serveParticipants(requests);
    renderApp('/participants', meFor('analyst'));
    expect(await screen.findByText('AC-0001', {}, { timeout: 15_000 })).toBeInTheDocument();
    expect(screen.getByRole('note', { name: 'Research use caution' })).toBeInTheDocument();
    expect(screen.getByText('45 participants')).toBeInTheDocument();
    expect(codesShown()).toHaveLength(20);

    // Sorted by code ascending at first, so one click asks for descending.
    await userEvent.click(screen.getByText('Participant'));
    await waitFor(() => expect(codesShown()[0]).toBe('AC-0045'));
    expect(requests.at(-1)?.get('sort')).toBe('code');
    expect(requests.at(-1)?.get('order')).toBe('desc');

    await userEvent.click(screen.getByTitle('3'));
    await waitFor(() =>
      expect(codesShown()).toEqual(['AC-0005', 'AC-0004', 'AC-0003', 'AC-0002', 'AC-0001']),
    );
    expect(requests.at(-1)?.get('page')).toBe('3');

    await userEvent.type(screen.getByLabelText('Search participant codes'), '0040');
    await waitFor(() => expect(requests.at(-1)?.get('q')).toBe('0040'), { timeout: 5000 });
    await waitFor(() => expect(codesShown()).toEqual(['AC-0040']));
    expect(requests.at(-1)?.get('page')).toBe('1');
  });

  it("filters by site on the server and shows each participant's site", async () => {
    const requests: URLSearchParams[] = [];
    serveParticipants(requests);
    renderApp('/participants', meFor('monitor'));
    expect(await screen.findByText('AC-0001', {}, { timeout: 15_000 })).toBeInTheDocument();
    await waitFor(() => expect(screen.getAllByText(SITE.code).length).toBeGreaterThan(0));
    await userEvent.click(screen.getByRole('button', { name: /filter/i }));
    await userEvent.click(await screen.findByText(`${OTHER_SITE.code} · ${OTHER_SITE.name}`));
    await userEvent.click(screen.getByRole('button', { name: 'OK' }));
    await waitFor(() => expect(requests.at(-1)?.get('siteId')).toBe(OTHER_SITE.id));
    await waitFor(() => expect(codesShown()).toHaveLength(9));
    expect(codesShown()[0]).toBe('AC-0005');
  });

  it('shows enrolment date and group, and keeps them at phone width', async () => {
    setViewportWidth(PHONE_WIDTH_PX);
    serveParticipants([]);
    renderApp('/participants', meFor('analyst'));
    expect(await screen.findByText('AC-0001', {}, { timeout: 15_000 })).toBeInTheDocument();
    const headers = screen.getAllByRole('columnheader').map((h) => h.textContent);
    expect(headers).toEqual(['Participant', 'Site', 'Enrolment', 'Group']);
    // Even-numbered participants are enrolled on 2024-01-10: AC-0002 in Arm B, AC-0004 in Arm A.
    const row = (code: string) => screen.getByText(code).closest('tr') as HTMLElement;
    await waitFor(() => expect(row('AC-0002')).toHaveTextContent('Arm B'));
    expect(row('AC-0002')).toHaveTextContent('10 Jan 2024');
    expect(row('AC-0004')).toHaveTextContent('Arm A');
    expect(row('AC-0001')).toHaveTextContent('—');
  });

  it('says so when a search finds nobody', async () => {
    serveParticipants([]);
    renderApp('/participants?search=ZZ-9', meFor('monitor'));
    expect(
      await screen.findByText('No participant code contains “ZZ-9”.', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
  });

  it('shows a failed load with a retry that works', async () => {
    // Every request fails until the user asks again, whatever SWR retries on its own.
    let userRetried = false;
    serveGroups();
    server.use(
      http.get('/api/sites', () =>
        HttpResponse.json({ items: [SITE], total: 1, page: 1, pageSize: 200 }),
      ),
      http.get('/api/participants', () =>
        userRetried
          ? HttpResponse.json({ items: ALL.slice(0, 20), total: 45, page: 1, pageSize: 20 })
          : HttpResponse.error(),
      ),
    );
    renderApp('/participants', meFor('analyst'));
    expect(
      await screen.findByText('The participants could not be loaded', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    expect(screen.getByRole('alert')).toHaveTextContent('Gyre could not reach the server.');
    userRetried = true;
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(await screen.findByText('AC-0001', {}, { timeout: 15_000 })).toBeInTheDocument();
  });
});
