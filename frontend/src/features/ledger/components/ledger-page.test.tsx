import type { AuditEntryView, Page } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { RESEARCH_CAUTION } from '../../../components/research-caution';
import { meFor, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { changeRows } from './entry-changes';

installMswServer();

// Generated test data: one flag raised by an analyst.
const flagEntry: AuditEntryView = {
  seq: 41,
  at: '2025-03-04T14:22:05.000Z',
  actorId: 'user-analyst',
  actorEmail: 'analyst@example.org',
  action: 'raise',
  objectType: 'Flag',
  objectId: 'f0a1b2c3-0000-4000-8000-000000000001',
  studyId: STUDY.id,
  siteId: 'site-a',
  before: null,
  after: { state: 'raised', raiseReason: 'ROI slowing of −0.42 Hz, CI excludes 0' },
  reason: 'ROI slowing of −0.42 Hz, CI excludes 0',
  clientIp: '127.0.0.1',
  prevHash: '0'.repeat(64),
  hash: 'f'.repeat(64),
};
const page = (items: AuditEntryView[]): Page<AuditEntryView> => ({
  items,
  total: items.length,
  page: 1,
  pageSize: 25,
});
const people = { items: [], total: 0, page: 1, pageSize: 200 };

describe('Ledger', () => {
  it("shows the caution, the chain's state and an entry's before and after", async () => {
    const queries: string[] = [];
    server.use(
      http.get('/api/audit', ({ request }) => {
        queries.push(new URL(request.url).search);
        return HttpResponse.json(page([flagEntry]));
      }),
      http.get('/api/audit/verify', () =>
        HttpResponse.json({
          intact: true,
          checked: 41,
          firstBroken: null,
          lastHash: 'f'.repeat(64),
        }),
      ),
      http.get('/api/users', () => HttpResponse.json(people)),
    );
    renderApp('/ledger?action=raise', meFor('monitor'));
    expect(await screen.findByRole('note', { name: 'Research use caution' })).toHaveTextContent(
      RESEARCH_CAUTION,
    );
    expect(await screen.findByText('The trail is intact')).toBeInTheDocument();
    expect(screen.getByText(/41 entries checked/)).toBeInTheDocument();
    const row = (await screen.findByText('analyst@example.org')).closest('tr') as HTMLElement;
    expect(within(row).getByText('ROI slowing of −0.42 Hz, CI excludes 0')).toBeInTheDocument();
    expect(queries[0]).toContain('action=raise');
    await userEvent.click(within(row).getByRole('button', { name: /expand/i }));
    const changes = await screen.findByRole('table', { name: 'Before and after of entry 41' });
    expect(within(changes).getByText('raiseReason')).toBeInTheDocument();
    // A raise creates the flag: nothing stood there before.
    expect(within(changes).getAllByText('(none)')).toHaveLength(2);
    // A monitor may export (shared/permissions.ts): the button shows.
    expect(screen.getByRole('button', { name: 'Export CSV' })).toBeInTheDocument();
  });

  it('says loudly where the chain is broken', async () => {
    server.use(
      http.get('/api/audit', () => HttpResponse.json(page([]))),
      http.get('/api/audit/verify', () =>
        HttpResponse.json({
          intact: false,
          checked: 12,
          firstBroken: { seq: 7, reason: 'stored hash differs from the recomputed one' },
          lastHash: null,
        }),
      ),
      http.get('/api/users', () => HttpResponse.json(people)),
    );
    renderApp('/ledger', meFor('monitor'));
    expect(await screen.findByText('The trail is broken')).toBeInTheDocument();
    expect(screen.getByText(/Entry #7 does not hold: stored hash differs/)).toBeInTheDocument();
    expect(await screen.findByText('The trail is empty so far.')).toBeInTheDocument();
  });

  it('shows an error with a retry when the trail cannot be loaded', async () => {
    let calls = 0;
    server.use(
      http.get('/api/audit', () => {
        calls += 1;
        return calls === 1
          ? HttpResponse.json(
              {
                statusCode: 503,
                code: 'UNAVAILABLE',
                message: 'The database is busy; try again.',
                details: null,
              },
              { status: 503 },
            )
          : HttpResponse.json(page([flagEntry]));
      }),
      http.get('/api/audit/verify', () =>
        HttpResponse.json({ intact: true, checked: 1, firstBroken: null, lastHash: null }),
      ),
      http.get('/api/users', () => HttpResponse.json(people)),
    );
    renderApp('/ledger', meFor('monitor'));
    expect(
      await screen.findByText('The trail could not be loaded', {}, { timeout: 15000 }),
    ).toBeInTheDocument();
    expect(screen.getByText('The database is busy; try again.')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    await waitFor(() => expect(screen.getByText('analyst@example.org')).toBeInTheDocument());
  });
});

describe('changeRows', () => {
  it('lines up both sides field by field and marks what changed', () => {
    expect(changeRows({ role: 'analyst', name: 'A' }, { role: 'monitor', name: 'A' })).toEqual([
      { field: 'role', before: 'analyst', after: 'monitor', changed: true },
      { field: 'name', before: 'A', after: 'A', changed: false },
    ]);
    expect(changeRows(null, null)).toEqual([]);
  });
});
