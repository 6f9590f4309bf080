import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor, SITE } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { PHONE_WIDTH_PX, setViewportWidth } from '../../../test/viewport';
import { participantRow } from '../testing/participant-fixtures';

installMswServer();

const OTHER_SITE = { ...SITE, id: 'site-b', code: 'SOUTH', name: 'South clinic' };
// Generated test data: 45 participants, every fifth at the second site.
const ALL = Array.from({ length: 45 }, (_, i) =>
  participantRow(i + 1, (i + 1) % 5 === 0 ? OTHER_SITE : SITE),
);

/** A stand-in for the server's list: it filters, sorts and pages as the query asks. */
function serveParticipants(requests: URLSearchParams[]) {
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
    await userEvent.click(screen.getByRole('columnheader', { name: 'Participant' }));
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

  it('filters by site from the keyboard and names each site in full', async () => {
    const requests: URLSearchParams[] = [];
    serveParticipants(requests);
    renderApp('/participants', meFor('monitor'));
    expect(await screen.findByText('AC-0001', {}, { timeout: 15_000 })).toBeInTheDocument();
    const row = (code: string) => screen.getByText(code).closest('tr') as HTMLElement;
    expect(row('AC-0001')).toHaveTextContent(SITE.name);
    expect(row('AC-0005')).toHaveTextContent(OTHER_SITE.name);
    expect(screen.queryByText(SITE.code)).not.toBeInTheDocument();
    // The search hint is a code of this study, not an invented one.
    expect(screen.getByLabelText('Search participant codes')).toHaveAttribute(
      'placeholder',
      'Search by code, e.g. AC-0001',
    );
    // Tab from the search field reaches the site filter.
    screen.getByLabelText('Search participant codes').focus();
    await userEvent.tab(); // the search button
    await userEvent.tab();
    const siteFilter = screen.getByRole('combobox', { name: 'Site' });
    expect(siteFilter).toHaveFocus();
    // (Choosing from the open list by keyboard is checked in Chromium: e2e/participants.e2e.ts.)
    await userEvent.click(siteFilter);
    await userEvent.click(await screen.findByTitle(OTHER_SITE.name));
    await waitFor(() => expect(requests.at(-1)?.get('siteId')).toBe(OTHER_SITE.id));
    await waitFor(() => expect(codesShown()).toHaveLength(9));
    expect(codesShown()[0]).toBe('AC-0005');
  });

  it('shows visits, latest values, open flags and the report, and fits a phone', async () => {
    setViewportWidth(PHONE_WIDTH_PX);
    serveParticipants([]);
    renderApp('/participants', meFor('analyst'));
    expect(await screen.findByText('AC-0001', {}, { timeout: 15_000 })).toBeInTheDocument();
    const headers = screen.getAllByRole('columnheader').map((h) => h.textContent);
    expect(headers).toEqual([
      'Participant',
      'Site',
      'Group',
      'Visits',
      'Latest PAF',
      'Latest Δf',
      'Open flags',
      'Latest visit: report',
    ]);
    const cells = (code: string) =>
      within(screen.getByText(code).closest('tr') as HTMLElement)
        .getAllByRole('cell')
        // The formatter puts a no-break space before units: compare as plain spaces.
        .map((cell) => (cell.textContent ?? '').replace(/\s/g, ' '));
    // AC-0007 (participantRow(7)): 4 visits, PAF 9.07 Hz and Δf −0.07 Hz at Month 18, one
    // open flag, revision 1 sent; Δf is written with a true minus sign (U+2212).
    expect(cells('AC-0007')).toEqual([
      'AC-0007',
      SITE.name,
      '—',
      '4',
      '9.07 Hz (Month 18)',
      '\u22120.07 Hz (Month 18)',
      '1 open',
      'Month 18: Revision 1 sent',
    ]);
    // AC-0003: no visit yet. AC-0002: Arm B, a draft never signed.
    expect(cells('AC-0003')).toEqual([
      'AC-0003',
      SITE.name,
      '—',
      '0',
      '—',
      '—',
      '0',
      'No visit yet',
    ]);
    expect(cells('AC-0002')).toContain('Month 12: Draft, not signed');
    expect(cells('AC-0002')).toContain('Arm B');
    // The table scrolls inside its own container instead of widening the page.
    const table = screen.getByRole('table');
    expect(table.closest('.ant-table-content, .ant-table-body')).not.toBeNull();
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
