import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { GYRE_COLORS } from '../../../app/theme';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { PHONE_WIDTH_PX, setViewportWidth } from '../../../test/viewport';
import { recording, useIntakeHandlers, visitPath } from '../testing/intake-fixtures';

installMswServer();

const replacement = recording({
  id: 'r-new',
  replacesId: 'r-old',
  replacementReason: 'Electrode O1 came loose halfway',
  createdAt: '2025-02-03T11:20:00.000Z',
});
const superseded = recording({
  id: 'r-old',
  state: 'superseded',
  supersededById: 'r-new',
  createdAt: '2025-02-03T10:05:00.000Z',
});

const CONFIRMED =
  'Uploaded as resting although the file holds 2 stimulus onset(s); the technician confirmed the kind.';

const withWarnings = recording({
  id: 'r-warn',
  kindConfirmed: true,
  warnings: [CONFIRMED],
  roiUsage: {
    wanted: ['O1', 'O2', 'Pz'],
    used: ['O1', 'Pz'],
    leftOut: [{ label: 'O2', reason: 'flat' }],
    status: 'partial',
  },
});
const noRoi = recording({
  id: 'r-task',
  kind: 'task',
  roiUsage: {
    wanted: ['O1', 'O2'],
    used: [],
    leftOut: [
      { label: 'O1', reason: 'saturated' },
      { label: 'O2', reason: 'missing' },
    ],
    status: 'none',
  },
});

const rowOf = (text: string | RegExp) => {
  const row = screen.getByText(text).closest('tr');
  expect(row).not.toBeNull();
  return row as HTMLTableRowElement;
};

// Whole screens render slowly in jsdom on a shared 2-core machine.
describe('Intake recordings', { timeout: 60_000 }, () => {
  const createObjectURL = vi.fn((_blob: Blob) => 'blob:stored-copy');
  beforeEach(() => {
    // jsdom has no object URLs; the download only hands the blob on.
    URL.createObjectURL = createObjectURL;
    URL.revokeObjectURL = vi.fn();
  });
  afterEach(() => createObjectURL.mockClear());

  it('keeps a superseded recording listed, set back, with why it was replaced, and downloads its stored copy', async () => {
    useIntakeHandlers(() => [replacement, superseded]);
    const asked: Array<string | null> = [];
    server.use(
      http.get('/api/recordings/r-old/file', ({ request }) => {
        asked.push(request.headers.get('Authorization'));
        return new HttpResponse(new Uint8Array([48, 32, 32]), {
          headers: {
            'Content-Type': 'application/octet-stream',
            'Content-Disposition': 'attachment; filename="AC-0042-V1-resting.edf"',
          },
        });
      }),
    );
    renderApp(visitPath, meFor('technician'));
    const old = (await screen.findByText('Superseded')).closest('tr') as HTMLTableRowElement;
    expect(old).toHaveTextContent(
      'Replaced by the upload of 3 Feb 2025, 11:20:00: “Electrode O1 came loose halfway”',
    );
    expect(old).toHaveStyle({ background: GYRE_COLORS.mist });
    const current = rowOf(/^Replaces the upload of/);
    expect(current).toHaveTextContent(
      'Replaces the upload of 3 Feb 2025, 10:05:00: “Electrode O1 came loose halfway”',
    );
    expect(within(current).getByText('Ready')).toBeInTheDocument();
    expect(current).not.toHaveStyle({ background: GYRE_COLORS.mist });
    // The current recording is downloadable too.
    expect(
      within(current).getByRole('button', {
        name: 'Download the resting recording uploaded 3 Feb 2025, 11:20:00',
      }),
    ).toBeInTheDocument();
    await userEvent.click(
      within(old).getByRole('button', {
        name: 'Download the superseded resting recording uploaded 3 Feb 2025, 10:05:00',
      }),
    );
    await waitFor(() => expect(createObjectURL).toHaveBeenCalledTimes(1));
    expect(asked).toEqual(['Bearer test-access-token']);
    expect(createObjectURL.mock.calls[0][0].size).toBe(3);
  });

  it('shows a ready recording with warnings in amber, every reason in view, and a plain ready one as ready', async () => {
    useIntakeHandlers(() => [withWarnings, noRoi, recording({ id: 'r-plain', kind: 'task' })]);
    renderApp(visitPath, meFor('technician'));
    const tags = await screen.findAllByText('Ready with warnings');
    expect(tags).toHaveLength(2);
    expect(screen.getAllByText('Ready')).toHaveLength(1);
    const warned = screen.getByRole('list', { name: 'Warnings about the resting recording' });
    expect(
      within(warned)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['Region of interest from O1, Pz only; left out O2 (flat).', CONFIRMED]);
    expect(warned).toBeVisible();
    // The amber comes from this class (features/intake/intake.css: the theme's colorWarning).
    expect(warned).toHaveClass('gyre-warning-list');
    expect(
      screen.getByRole('list', { name: 'Warnings about the task recording' }),
    ).toHaveTextContent(
      "No region-of-interest channel remains: O1 (saturated: held at the converter's limit), O2 (not in the file).",
    );
  });

  it("does not repeat the server's own words about the region of interest", async () => {
    useIntakeHandlers(() => [
      recording({
        ...noRoi,
        warnings: [
          'No region-of-interest channel remains: O1 (saturated); O2 (not in the file). There is no region-of-interest result.',
        ],
      }),
    ]);
    renderApp(visitPath, meFor('technician'));
    const list = await screen.findByRole('list', { name: 'Warnings about the task recording' });
    expect(within(list).getAllByRole('listitem')).toHaveLength(1);
  });

  it('keeps state, warnings and download at phone width, and drops the file and time columns', async () => {
    setViewportWidth(PHONE_WIDTH_PX);
    useIntakeHandlers(() => [withWarnings]);
    renderApp(visitPath, meFor('technician'));
    const warned = await screen.findByRole('list', {
      name: 'Warnings about the resting recording',
    });
    expect(warned).toHaveTextContent('left out O2 (flat)');
    expect(screen.getByText('Ready with warnings')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: /^Download the resting recording/ })).toBeVisible();
    expect(screen.queryByRole('columnheader', { name: 'File' })).not.toBeInTheDocument();
    expect(screen.queryByRole('columnheader', { name: 'Uploaded' })).not.toBeInTheDocument();
    // The upload time moves under the kind instead.
    expect(rowOf('Ready with warnings')).toHaveTextContent('3 Feb 2025, 10:05:00');
  });

  it('shows the file and time columns on a desktop screen', async () => {
    useIntakeHandlers(() => [withWarnings]);
    renderApp(visitPath, meFor('technician'));
    expect(await screen.findByRole('columnheader', { name: 'File' })).toBeInTheDocument();
    expect(screen.getByRole('columnheader', { name: 'Uploaded' })).toBeInTheDocument();
  });
});
