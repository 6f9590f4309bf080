import type { Page, ReportRevisionView, ReportSignOffView, Role } from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { AbilityProvider } from '@casl/react';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { MemoryRouter } from 'react-router-dom';
import { SWRConfig } from 'swr';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AppProvider } from '../../../app/provider';
import { setAccessToken } from '../../../lib/api-client';
import { abilityFromRules } from '../../../lib/session/ability';
import { meFor, SITE } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { ReportSignOff } from './report-sign-off';
import { SignedReports } from './signed-reports';
import { errorResponse } from '../../../test/error-response';

installMswServer();

// Generated test data: one visit, its report and signed revisions.
const VISIT = 'visit-1';
const FINGERPRINT = 'f'.repeat(64);
const PDF_BYTES = new TextEncoder().encode('%PDF-1.7 generated test bytes');

const revision = (n: number, state: ReportRevisionView['state'] = 'sent'): ReportRevisionView => ({
  id: `rev-${n}`,
  reportId: 'report-1',
  visitId: VISIT,
  participantId: 'p-1',
  siteId: SITE.id,
  revision: n,
  state,
  participantCode: 'AC-0042',
  visitLabel: 'V2',
  visitDate: '2025-03-01',
  signedById: 'user-analyst',
  signerName: 'Ana Lyst',
  signedAt: `2025-03-0${n}T10:00:00.000Z`,
  meaning: SIGNATURE_MEANING,
  pdfSha256: String(n).repeat(64),
  pdfSizeBytes: 1000,
  supersedesId: n > 1 ? `rev-${n - 1}` : null,
  sentAt: state === 'sent' ? `2025-03-0${n}T10:01:00.000Z` : null,
});

const signOff = (overrides: Partial<ReportSignOffView> = {}): ReportSignOffView => ({
  report: {
    id: 'report-1',
    visitId: VISIT,
    participantId: 'p-1',
    siteId: SITE.id,
    state: 'draft',
    createdAt: '2025-03-01T09:00:00.000Z',
    updatedAt: '2025-03-01T09:00:00.000Z',
  },
  meaning: SIGNATURE_MEANING,
  draftFingerprint: FINGERPRINT,
  pendingRevision: 1,
  canSign: true,
  cannotSignReason: null,
  revisions: [],
  ...overrides,
});

function renderWith(role: Role, ui: React.ReactNode, path = '/') {
  setAccessToken('test-access-token');
  return render(
    <AppProvider>
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <AbilityProvider value={abilityFromRules(meFor(role).rules)}>
          <MemoryRouter initialEntries={[path]}>{ui}</MemoryRouter>
        </AbilityProvider>
      </SWRConfig>
    </AppProvider>,
  );
}

const previewResponse = () =>
  new HttpResponse(PDF_BYTES, { headers: { 'Content-Type': 'application/pdf' } });

beforeEach(() => {
  // jsdom has no object URLs; the dialog and downloads only hand them on.
  URL.createObjectURL = vi.fn(() => 'blob:generated-preview');
  URL.revokeObjectURL = vi.fn();
});
afterEach(() => vi.restoreAllMocks());

describe('ReportSignOff', () => {
  it('previews the draft, then signs with the password, the confirmed meaning and the previewed fingerprint', async () => {
    const user = userEvent.setup();
    let current = signOff();
    const bodies: unknown[] = [];
    let previews = 0;
    server.use(
      http.get(`/api/visits/${VISIT}/report/sign-off`, () => HttpResponse.json(current)),
      http.get(`/api/visits/${VISIT}/report/preview`, () => {
        previews += 1;
        return previewResponse();
      }),
      http.post(`/api/visits/${VISIT}/report/sign`, async ({ request }) => {
        const body = (await request.json()) as { password: string };
        bodies.push(body);
        if (body.password !== 'right-password-42') {
          return errorResponse(
            422,
            'SIGNOFF_WRONG_PASSWORD',
            'password: does not match your password; the report was not signed.',
            { field: 'password' },
          );
        }
        current = signOff({
          report: { ...current.report, state: 'signed' },
          pendingRevision: null,
          canSign: false,
          cannotSignReason: 'Revision 1 is signed and nothing has changed since.',
          revisions: [revision(1, 'signed')],
        });
        return HttpResponse.json(revision(1, 'signed'), { status: 201 });
      }),
    );
    renderWith('analyst', <ReportSignOff visitId={VISIT} />);
    expect(await screen.findByText('Draft, not signed yet')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Preview and sign revision 1' }));

    const dialog = await screen.findByRole('dialog');
    expect(await within(dialog).findByTitle('Draft report preview')).toHaveAttribute(
      'src',
      'blob:generated-preview',
    );
    expect(previews).toBe(1);
    expect(within(dialog).getByRole('alert')).toHaveTextContent('Research use only.');

    // Neither the meaning nor the password may be skipped.
    await user.click(within(dialog).getByRole('button', { name: 'Sign revision 1' }));
    expect(
      await within(dialog).findByText('Confirm the meaning of your signature.'),
    ).toBeInTheDocument();
    expect(within(dialog).getByText('Enter your password to sign.')).toBeInTheDocument();
    expect(bodies).toEqual([]);

    await user.click(
      within(dialog).getByRole('checkbox', { name: `I confirm: ${SIGNATURE_MEANING}.` }),
    );
    await user.type(within(dialog).getByLabelText('Your password, entered again'), 'wrong-one');
    await user.click(within(dialog).getByRole('button', { name: 'Sign revision 1' }));
    expect(await within(dialog).findByText('This is not your password.')).toBeInTheDocument();

    await user.type(
      within(dialog).getByLabelText('Your password, entered again'),
      'right-password-42',
    );
    await user.click(within(dialog).getByRole('button', { name: 'Sign revision 1' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(bodies).toEqual([
      { password: 'wrong-one', meaning: SIGNATURE_MEANING, fingerprint: FINGERPRINT },
      { password: 'right-password-42', meaning: SIGNATURE_MEANING, fingerprint: FINGERPRINT },
    ]);
    // The panel reloads: revision 1 listed with its signer, no sign button enabled.
    expect(
      await screen.findByText('Revision 1 is signed and nothing has changed since.'),
    ).toBeInTheDocument();
    expect(screen.getByText(/Ana Lyst/)).toHaveTextContent(SIGNATURE_MEANING);
    expect(screen.getByRole('button', { name: 'Download revision 1' })).toBeEnabled();
  });

  it('reloads the draft when the server says the visit changed since the preview', async () => {
    const user = userEvent.setup();
    let statusCalls = 0;
    let previews = 0;
    server.use(
      http.get(`/api/visits/${VISIT}/report/sign-off`, () => {
        statusCalls += 1;
        return HttpResponse.json(signOff());
      }),
      http.get(`/api/visits/${VISIT}/report/preview`, () => {
        previews += 1;
        return previewResponse();
      }),
      http.post(`/api/visits/${VISIT}/report/sign`, () =>
        errorResponse(
          409,
          'SIGNOFF_CONTENT_CHANGED',
          'fingerprint: the visit changed since this draft was previewed',
        ),
      ),
    );
    renderWith('analyst', <ReportSignOff visitId={VISIT} />);
    await user.click(await screen.findByRole('button', { name: 'Preview and sign revision 1' }));
    const dialog = await screen.findByRole('dialog');
    await within(dialog).findByTitle('Draft report preview');
    const before = statusCalls;
    await user.click(within(dialog).getByRole('checkbox'));
    await user.type(within(dialog).getByLabelText('Your password, entered again'), 'pw-1234567');
    await user.click(within(dialog).getByRole('button', { name: 'Sign revision 1' }));
    expect(
      await within(dialog).findByText(/The visit changed since this preview/),
    ).toBeInTheDocument();
    await waitFor(() => expect(previews).toBe(2));
    expect(statusCalls).toBeGreaterThan(before);
  });

  it('shows a monitor the preview and the revisions but no way to sign', async () => {
    server.use(
      http.get(`/api/visits/${VISIT}/report/sign-off`, () =>
        HttpResponse.json(
          signOff({
            pendingRevision: 2,
            revisions: [revision(1)],
            report: { ...signOff().report },
          }),
        ),
      ),
    );
    renderWith('monitor', <ReportSignOff visitId={VISIT} />);
    expect(
      await screen.findByText('Revision 2 awaits signing (revision 1 sent)'),
    ).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Preview draft' })).toBeEnabled();
    expect(screen.queryByRole('button', { name: /sign/i })).not.toBeInTheDocument();
  });
});

describe('SignedReports', () => {
  const page = (items: ReportRevisionView[]): Page<ReportRevisionView> => ({
    items,
    total: items.length,
    page: 1,
    pageSize: 20,
  });

  it('lists every signed revision of the site, opens the linked one and downloads its PDF', async () => {
    const user = userEvent.setup();
    const downloads: string[] = [];
    server.use(
      http.get('/api/report-revisions', () => HttpResponse.json(page([revision(2), revision(1)]))),
      http.get('/api/report-revisions/rev-1', () => HttpResponse.json(revision(1))),
      http.get('/api/report-revisions/:id/file', ({ params }) => {
        downloads.push(String(params.id));
        return new HttpResponse(PDF_BYTES, {
          headers: {
            'Content-Type': 'application/pdf',
            'Content-Disposition': 'attachment; filename="gyre-report-AC-0042-V2-r1.pdf"',
          },
        });
      }),
    );
    const click = vi
      .spyOn(HTMLAnchorElement.prototype, 'click')
      .mockImplementation(() => undefined);
    renderWith('coordinator', <SignedReports />, '/reports?revision=rev-1');
    const linked = await screen.findByRole('region', { name: 'The report you were sent' });
    expect(linked).toHaveTextContent('AC-0042, V2');
    expect(linked).toHaveTextContent('revision 1');
    const rows = await screen.findAllByRole('button', {
      name: /Download PDF: AC-0042 V2 revision/,
    });
    expect(rows.map((b) => b.getAttribute('aria-label'))).toEqual([
      'Download PDF: AC-0042 V2 revision 1',
      'Download PDF: AC-0042 V2 revision 2',
      'Download PDF: AC-0042 V2 revision 1',
    ]);
    await user.click(
      within(linked).getByRole('button', { name: 'Download PDF: AC-0042 V2 revision 1' }),
    );
    await waitFor(() => expect(downloads).toEqual(['rev-1']));
    expect(click).toHaveBeenCalledTimes(1);
  });
});
