import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AppProvider } from '../../../app/provider';
import { RESEARCH_CAUTION } from '../../../components/research-caution';
import { setAccessToken } from '../../../lib/api-client';
import { installMswServer, server } from '../../../test/msw-server';
import { StudyExportLinks } from './study-export-links';
import { errorResponse } from '../../../test/error-response';

installMswServer();

describe('StudyExportLinks', () => {
  const createObjectURL = vi.fn((_blob: Blob) => 'blob:export');
  beforeEach(() => {
    // jsdom has no object URLs; the download only hands the blob on.
    URL.createObjectURL = createObjectURL;
    URL.revokeObjectURL = vi.fn();
    setAccessToken('test-access-token');
  });
  afterEach(() => createObjectURL.mockClear());

  it('shows the research caution and downloads each export with the session token', async () => {
    const asked: Array<{ path: string; auth: string | null }> = [];
    server.use(
      http.get('/api/studies/s-1/results.csv', ({ request }) => {
        asked.push({ path: 'results.csv', auth: request.headers.get('authorization') });
        return new HttpResponse('study_code\r\nALPHA\r\n', {
          headers: {
            'Content-Type': 'text/csv',
            'Content-Disposition': 'attachment; filename="gyre-ALPHA-results-2026-01-01.csv"',
          },
        });
      }),
      http.get('/api/studies/s-1/conditions.csv', ({ request }) => {
        asked.push({ path: 'conditions.csv', auth: request.headers.get('authorization') });
        return new HttpResponse('study_code\r\n', { headers: { 'Content-Type': 'text/csv' } });
      }),
      http.get('/api/studies/s-1/export.zip', ({ request }) => {
        asked.push({ path: 'export.zip', auth: request.headers.get('authorization') });
        return new HttpResponse(new Uint8Array([0x50, 0x4b, 5, 6]), {
          headers: { 'Content-Type': 'application/zip' },
        });
      }),
    );
    render(
      <AppProvider>
        <StudyExportLinks studyId="s-1" />
      </AppProvider>,
    );
    expect(screen.getByRole('note', { name: 'Research use caution' })).toHaveTextContent(
      RESEARCH_CAUTION,
    );
    expect(screen.getByRole('note')).toHaveTextContent(/not for diagnosis/);
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Results table (CSV)' }));
    await waitFor(() => expect(createObjectURL).toHaveBeenCalledTimes(1));
    expect(createObjectURL.mock.calls[0][0].size).toBe('study_code\r\nALPHA\r\n'.length);
    await user.click(screen.getByRole('button', { name: 'BIDS derivatives (ZIP)' }));
    await waitFor(() => expect(createObjectURL).toHaveBeenCalledTimes(2));
    expect(createObjectURL.mock.calls[1][0].size).toBe(4);
    await user.click(screen.getByRole('button', { name: 'Conditions table (CSV)' }));
    await waitFor(() => expect(createObjectURL).toHaveBeenCalledTimes(3));
    expect(createObjectURL.mock.calls[2][0].size).toBe('study_code\r\n'.length);
    expect(asked).toEqual([
      { path: 'results.csv', auth: 'Bearer test-access-token' },
      { path: 'export.zip', auth: 'Bearer test-access-token' },
      { path: 'conditions.csv', auth: 'Bearer test-access-token' },
    ]);
  });

  it('says why when the server refuses', async () => {
    server.use(
      http.get('/api/studies/s-1/export.zip', () =>
        errorResponse(403, 'AUTH_FORBIDDEN', 'You may not export Result.'),
      ),
    );
    render(
      <AppProvider>
        <StudyExportLinks studyId="s-1" />
      </AppProvider>,
    );
    await userEvent.setup().click(screen.getByRole('button', { name: 'BIDS derivatives (ZIP)' }));
    expect(await screen.findByText('You may not export Result.')).toBeInTheDocument();
    expect(createObjectURL).not.toHaveBeenCalled();
  });
});
