import type { Page, ReportView } from '@gyre/shared';
import { screen, within } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { RESEARCH_CAUTION } from '../../../components/research-caution';
import { meFor, SITE } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';

installMswServer();

// Generated test data.
const report = (id: string, state: ReportView['state']): ReportView => ({
  id,
  visitId: `visit-${id}`,
  participantId: 'p-1',
  siteId: SITE.id,
  state,
  createdAt: '2025-03-01T09:00:00.000Z',
  updatedAt: '2025-03-02T09:00:00.000Z',
});
const page = <T,>(items: T[]): Page<T> => ({ items, total: items.length, page: 1, pageSize: 200 });

function handlers(reports: ReportView[]) {
  server.use(
    http.get('/api/reports', () => HttpResponse.json(page(reports))),
    http.get('/api/participants', () =>
      HttpResponse.json(
        page([
          {
            id: 'p-1',
            code: 'AC-0042',
            studyId: 's',
            siteId: SITE.id,
            createdAt: '',
            updatedAt: '',
          },
        ]),
      ),
    ),
    http.get('/api/visits', () =>
      HttpResponse.json(
        page([
          {
            id: 'visit-r1',
            participantId: 'p-1',
            studyId: 's',
            siteId: SITE.id,
            label: 'V1',
            visitDate: '2025-02-28',
            createdAt: '',
            updatedAt: '',
          },
        ]),
      ),
    ),
  );
}

describe('Reports', () => {
  it('lists signed reports with code, visit and a download; a coordinator has no draft filter', async () => {
    handlers([report('r1', 'signed')]);
    renderApp('/reports', meFor('coordinator'));
    expect(await screen.findByRole('note', { name: 'Research use caution' })).toHaveTextContent(
      RESEARCH_CAUTION,
    );
    const row = (await screen.findByText('AC-0042')).closest('tr') as HTMLElement;
    expect(within(row).getByText('V1')).toBeInTheDocument();
    expect(within(row).getByText('Signed')).toBeInTheDocument();
    expect(
      within(row).getByRole('button', { name: 'Download the report of AC-0042-V1' }),
    ).toBeInTheDocument();
    // Coordinators never see drafts (shared/permissions.ts), so the filter does not offer them.
    expect(screen.queryByText('Draft')).not.toBeInTheDocument();
  });

  it('offers no download for a draft, and an analyst may filter drafts', async () => {
    handlers([report('r2', 'draft')]);
    renderApp('/reports', meFor('analyst'));
    expect(await screen.findByText('Not signed yet')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Download/ })).not.toBeInTheDocument();
    expect(screen.getAllByText('Draft').length).toBeGreaterThanOrEqual(2);
  });

  it('says what will appear when there is nothing yet', async () => {
    handlers([]);
    renderApp('/reports', meFor('coordinator'));
    expect(
      await screen.findByText(
        'No reports yet. A report appears here once an analyst signs a visit.',
      ),
    ).toBeInTheDocument();
  });
});
