import type { BulkUploadReport, BulkUploadRowReport } from '@gyre/shared';
import { fireEvent, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { HttpResponse } from 'msw';
import { beforeEach, describe, expect, it } from 'vitest';
import { meFor, STUDY } from '../../../test/fixtures';
import { installMswServer } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import {
  checkThenImport,
  findImportCard,
  importWhenAllowed,
  refusedImport,
  serveStudyImport,
} from '../testing/import-fixtures';
import { useIntakeHandlers } from '../testing/intake-fixtures';

installMswServer();

const row = (change: Partial<BulkUploadRowReport>): BulkUploadRowReport => ({
  row: 1,
  participantCode: 'AC-0042',
  plannedVisit: 'Baseline',
  kind: 'resting',
  file: 'rest.edf',
  onsetsFile: null,
  status: 'ok',
  errors: [],
  warnings: [],
  visit: 'new',
  recordingId: null,
  visitId: null,
  ...change,
});

const report = (rows: BulkUploadRowReport[], change: Partial<BulkUploadReport> = {}) => ({
  studyId: STUDY.id,
  dryRun: true,
  imported: false,
  rows,
  strayFiles: [],
  summary: {
    rows: rows.length,
    ok: rows.filter((r) => r.status === 'ok').length,
    warnings: rows.filter((r) => r.status === 'warning').length,
    errors: rows.filter((r) => r.status === 'error').length,
    newVisits: 1,
  },
  ...change,
});

const serveBulk = (answers: Array<() => Response>) => serveStudyImport('bulk-uploads', answers);

async function dropIntoPanel(names: string[]) {
  const card = await findImportCard('Bulk upload');
  const input = card.querySelector<HTMLInputElement>('input[type=file][multiple]');
  expect(input).not.toBeNull();
  fireEvent.change(input as HTMLInputElement, {
    target: { files: names.map((name) => new File([new Uint8Array(64)], name)) },
  });
  return card;
}

describe('Intake bulk upload', { timeout: 60_000 }, () => {
  beforeEach(() => useIntakeHandlers(() => []));

  it('finds manifest.csv among the dropped files, checks, then imports only after a clean check', async () => {
    const okRows = [
      row({}),
      row({
        row: 2,
        kind: 'task',
        file: 'task.edf',
        status: 'warning',
        warnings: ['visit date 2025-03-01 is late for Baseline'],
      }),
    ];
    const sent = serveBulk([
      () => HttpResponse.json(report(okRows)),
      () =>
        HttpResponse.json(
          report(
            okRows.map((r) => ({ ...r, recordingId: `rec-${r.row}` })),
            { dryRun: false, imported: true },
          ),
          {
            status: 201,
          },
        ),
    ]);
    renderApp('/intake', meFor('technician'));
    const card = await dropIntoPanel(['manifest.csv', 'rest.edf', 'task.edf']);
    expect(await within(card).findByText('Manifest: manifest.csv, 2 files')).toBeInTheDocument();
    const importButton = within(card).getByRole('button', { name: 'Import' });
    expect(importButton).toBeDisabled();
    await userEvent.click(within(card).getByRole('button', { name: 'Check (dry run)' }));
    const table = await within(card).findByRole('table', {}, { timeout: 15_000 });
    expect(within(table).getByText('late', { exact: false })).toHaveTextContent(
      'visit date 2025-03-01 is late for Baseline',
    );
    expect(
      within(card).getByText(
        /Checked, nothing imported yet\. 2 rows: 1 ready, 1 with a warning, 0 with an error/,
      ),
    ).toBeInTheDocument();
    await importWhenAllowed(card, 'Import');
    expect(
      await within(card).findByText(/Imported: 2 recordings queued\./, {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    // The dropped files are cleared once imported; a new batch starts from nothing.
    expect(within(card).getByText(/No manifest yet/)).toBeInTheDocument();
    // The manifest goes first as its own part; the other two files as `files`.
    expect(sent).toEqual([
      { dryRun: true, parts: ['manifest', 'files', 'files'] },
      { dryRun: false, parts: ['manifest', 'files', 'files'] },
    ]);
  });

  it('shows each failing row and the unlisted files, and keeps Import disabled', async () => {
    const rows = [
      row({}),
      row({
        row: 2,
        participantCode: 'ZZ-1',
        status: 'error',
        errors: ['participant_code: no participant ZZ-1 in this study'],
      }),
    ];
    serveBulk([
      () =>
        HttpResponse.json(
          report(rows, {
            strayFiles: [
              { file: 'extra.edf', message: 'extra.edf was uploaded but no manifest row names it' },
            ],
          }),
        ),
    ]);
    renderApp('/intake', meFor('technician'));
    const card = await dropIntoPanel(['manifest.csv', 'rest.edf', 'extra.edf']);
    await userEvent.click(within(card).getByRole('button', { name: 'Check (dry run)' }));
    expect(
      await within(card).findByText(
        'participant_code: no participant ZZ-1 in this study',
        {},
        { timeout: 15_000 },
      ),
    ).toBeInTheDocument();
    expect(
      within(card).getByText('extra.edf was uploaded but no manifest row names it'),
    ).toBeInTheDocument();
    expect(
      within(card).getByText(
        /Nothing was imported\. 2 rows: 1 ready, 0 with a warning, 1 with an error/,
      ),
    ).toBeInTheDocument();
    expect(within(card).getByRole('button', { name: 'Import' })).toBeDisabled();
  });

  it('shows the per-row report a refused import carries (422) and keeps Import disabled', async () => {
    const failed = report(
      [row({ status: 'error', errors: ['RECORDING_REJECTED: not an EDF file'] })],
      {
        dryRun: false,
      },
    );
    serveBulk([
      () => HttpResponse.json(report([row({})])),
      () => refusedImport('BULK_UPLOAD_ROWS_INVALID', 'report', failed),
    ]);
    renderApp('/intake', meFor('technician'));
    const card = await dropIntoPanel(['manifest.csv', 'rest.edf']);
    await checkThenImport(card, 'Check (dry run)', 'Import');
    expect(
      await within(card).findByText('RECORDING_REJECTED: not an EDF file', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    // antd keeps the loading icon (named "loading") while it fades out, which jsdom never ends.
    expect(within(card).getByRole('button', { name: /Import$/ })).toBeDisabled();
  });
});
