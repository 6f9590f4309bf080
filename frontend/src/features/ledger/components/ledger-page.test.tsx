import type { AuditEntryView, Page } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { RESEARCH_CAUTION } from '../../../components/research-caution';
import { failingOnce } from '../../../test/error-response';
import { meFor, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';

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
  context: {
    actorName: 'Ana Lyst',
    participantId: 'participant-1',
    participantCode: 'A1-0007',
    visitId: 'visit-1',
    visitLabel: 'V2',
    recordingKind: null,
    people: { 'user-analyst': 'Ana Lyst' },
  },
};
// Three entries (38–40) of another study lie between these two: outside a monitor's access.
const olderEntry: AuditEntryView = {
  ...flagEntry,
  seq: 37,
  action: 'create',
  objectType: 'Visit',
  objectId: 'visit-1',
  after: { label: 'V2', visitDate: '2025-03-01' },
  reason: null,
};
const page = (items: AuditEntryView[]): Page<AuditEntryView> => ({
  items,
  total: items.length,
  page: 1,
  pageSize: 25,
});
const people = { items: [], total: 0, page: 1, pageSize: 200 };

describe('Ledger', () => {
  it("shows the caution, the chain's state and each entry as a sentence with its changes", async () => {
    const queries: string[] = [];
    let checks = 0;
    server.use(
      http.get('/api/audit', ({ request }) => {
        queries.push(new URL(request.url).search);
        return HttpResponse.json(page([flagEntry, olderEntry]));
      }),
      http.get('/api/audit/verify', () => {
        checks += 1;
        return HttpResponse.json({
          intact: true,
          checked: 40 + checks,
          firstBroken: null,
          lastHash: 'f'.repeat(64),
        });
      }),
      http.get('/api/users', () => HttpResponse.json(people)),
      http.get('/api/participants', () => HttpResponse.json({ ...people, items: [] })),
    );
    renderApp('/ledger?action=raise', meFor('monitor'));
    expect(await screen.findByRole('note', { name: 'Research use caution' })).toHaveTextContent(
      RESEARCH_CAUTION,
    );
    expect(await screen.findByText('The trail is intact')).toBeInTheDocument();
    expect(screen.getByText(/41 entries checked/)).toBeInTheDocument();
    const entry = await screen.findByRole('article', { name: 'Entry 41' });
    expect(entry).toHaveTextContent(
      'Ana Lyst raised a slowing flag on A1-0007 · V2: ROI slowing of −0.42 Hz, CI excludes 0',
    );
    expect(within(entry).getByRole('link', { name: 'A1-0007 · V2' })).toHaveAttribute(
      'href',
      '/review/visit-1',
    );
    expect(queries[0]).toContain('action=raise');
    // The viewer's zone is stated once; each time carries its zone's short name.
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    expect(
      screen.getByText(new RegExp(`Times are shown in ${zone} \\(UTC[+-]\\d\\d:\\d\\d\\)`)),
    ).toBeInTheDocument();
    // The jump from #41 to #37 is explained, inline and once near the list.
    expect(screen.getByText(/3 entries not shown \(filters or access\)/)).toBeInTheDocument();
    expect(screen.getByRole('note', { name: 'Why entry numbers jump' })).toBeInTheDocument();

    await userEvent.click(within(entry).getByRole('button', { name: 'Details' }));
    const changes = await screen.findByRole('table', { name: 'Changes in entry 41' });
    expect(within(changes).getByText('Reason for raising')).toBeInTheDocument();
    // A raise creates the flag: nothing stood there before, written as one dash.
    expect(within(changes).getAllByText('—')).toHaveLength(2);
    expect(within(changes).queryByText('(none)')).toBeNull();
    expect(within(entry).getByText('Recorded data')).toBeInTheDocument();
    // A monitor may export (shared/permissions.ts): the button shows.
    expect(screen.getByRole('button', { name: 'Export CSV' })).toBeInTheDocument();

    await userEvent.click(screen.getByRole('button', { name: 'Check again' }));
    expect(await screen.findByText(/Checked .*: intact, 42 entries checked\./)).toBeInTheDocument();
    expect(screen.getByText(/42 entries checked: each one/)).toHaveTextContent(/Last checked/);
  });

  it('offers a participant filter by code and sends the chosen id to the server', async () => {
    const queries: string[] = [];
    server.use(
      http.get('/api/audit', ({ request }) => {
        queries.push(new URL(request.url).search);
        return HttpResponse.json(page([flagEntry]));
      }),
      http.get('/api/audit/verify', () =>
        HttpResponse.json({ intact: true, checked: 41, firstBroken: null, lastHash: null }),
      ),
      http.get('/api/users', () => HttpResponse.json(people)),
      http.get('/api/participants', () =>
        HttpResponse.json({
          ...people,
          items: [{ id: 'participant-1', code: 'A1-0007', studyId: STUDY.id, siteId: 'site-a' }],
          total: 1,
        }),
      ),
      http.get('/api/participants/participant-1', () =>
        HttpResponse.json({
          id: 'participant-1',
          code: 'A1-0007',
          studyId: STUDY.id,
          siteId: 'site-a',
        }),
      ),
    );
    renderApp('/ledger', meFor('monitor'));
    await screen.findByRole('article', { name: 'Entry 41' });
    expect(screen.getByLabelText('From date')).toBeInTheDocument();
    expect(screen.getByLabelText('To date')).toBeInTheDocument();
    await userEvent.click(screen.getByLabelText('Participant'));
    await userEvent.click(await screen.findByTitle('A1-0007'));
    await waitFor(() => expect(queries.at(-1)).toContain('participantId=participant-1'));
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
      http.get('/api/participants', () => HttpResponse.json(people)),
    );
    renderApp('/ledger', meFor('monitor'));
    expect(await screen.findByText('The trail is broken')).toBeInTheDocument();
    expect(screen.getByText(/Entry #7 does not hold: stored hash differs/)).toBeInTheDocument();
    expect(await screen.findByText('The trail is empty so far.')).toBeInTheDocument();
  });

  it('shows an error with a retry when the trail cannot be loaded', async () => {
    server.use(
      http.get(
        '/api/audit',
        failingOnce(503, 'UNAVAILABLE', 'The database is busy; try again.', () =>
          HttpResponse.json(page([flagEntry])),
        ),
      ),
      http.get('/api/audit/verify', () =>
        HttpResponse.json({ intact: true, checked: 1, firstBroken: null, lastHash: null }),
      ),
      http.get('/api/users', () => HttpResponse.json(people)),
      http.get('/api/participants', () => HttpResponse.json(people)),
    );
    renderApp('/ledger', meFor('monitor'));
    expect(
      await screen.findByText('The trail could not be loaded', {}, { timeout: 15000 }),
    ).toBeInTheDocument();
    expect(screen.getByText('The database is busy; try again.')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    await waitFor(() =>
      expect(screen.getByRole('article', { name: 'Entry 41' })).toHaveTextContent('Ana Lyst'),
    );
  });
});
