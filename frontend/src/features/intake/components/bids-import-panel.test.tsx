import type { BidsImportFilePreview, BidsImportPreview } from '@gyre/shared';
import { fireEvent, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { HttpResponse } from 'msw';
import { beforeEach, describe, expect, it, vi } from 'vitest';
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

const DIR = 'study/sub-AC0042/ses-baseline/eeg';

const file = (change: Partial<BidsImportFilePreview>): BidsImportFilePreview => ({
  path: `${DIR}/sub-AC0042_ses-baseline_task-rest_eeg.edf`,
  subject: 'AC0042',
  participantCode: 'AC-0042',
  participant: 'existing',
  session: 'baseline',
  plannedVisit: 'Baseline',
  visit: 'new',
  visitDate: '2026-01-02',
  task: 'rest',
  taskName: 'rest',
  kind: 'resting',
  onsetCount: null,
  conditions: [],
  channelsLeftOut: [{ label: 'O2', reason: 'electrode bridged' }],
  lineFrequencyHz: 50,
  problems: [],
  warnings: [],
  recordingId: null,
  visitId: null,
  ...change,
});

const preview = (
  files: BidsImportFilePreview[],
  change: Partial<BidsImportPreview> = {},
): BidsImportPreview => ({
  studyId: STUDY.id,
  dryRun: true,
  imported: false,
  files,
  problems: [],
  summary: {
    files: files.length,
    withProblems: files.filter((f) => f.problems.length > 0).length,
    newParticipants: 0,
    newVisits: 1,
  },
  ...change,
});

const serveImport = (answers: Array<() => Response>) => serveStudyImport('bids-imports', answers);

/** A folder drop: each File carries its path in the folder, as a browser's folder picker sets it. */
async function chooseFolder(paths: string[]) {
  const card = await findImportCard('EEG-BIDS import');
  const input = within(card).getByLabelText('BIDS folder');
  const files = paths.map((path) => {
    const f = new File([new Uint8Array(64)], path.split('/').at(-1) ?? path);
    Object.defineProperty(f, 'webkitRelativePath', { value: path });
    return f;
  });
  fireEvent.change(input, { target: { files } });
  return card;
}

describe('Intake EEG-BIDS import', { timeout: 60_000 }, () => {
  beforeEach(() => useIntakeHandlers(() => []));

  it('sends the folder with its paths, shows the preview, and imports only on confirmation', async () => {
    const files = [
      file({}),
      file({
        path: `${DIR}/sub-AC0042_ses-baseline_task-oddball_eeg.edf`,
        task: 'oddball',
        taskName: 'auditory oddball',
        kind: 'task',
        onsetCount: 4,
        conditions: ['target', 'standard'],
        channelsLeftOut: [],
        lineFrequencyHz: 60,
      }),
    ];
    const sent = serveImport([
      () => HttpResponse.json(preview(files)),
      () =>
        HttpResponse.json(
          preview(
            files.map((f, i) => ({ ...f, recordingId: `rec-${i}` })),
            { dryRun: false, imported: true },
          ),
          { status: 201 },
        ),
    ]);
    // jsdom's XMLHttpRequest sends file parts as 'blob': the names are read where they are set.
    const append = vi.spyOn(FormData.prototype, 'append');
    renderApp('/intake', meFor('technician'));
    const paths = [
      `${DIR}/sub-AC0042_ses-baseline_task-rest_eeg.edf`,
      `${DIR}/sub-AC0042_ses-baseline_task-rest_channels.tsv`,
    ];
    const card = await chooseFolder(paths);
    expect(within(card).getByText('Folder: 2 files')).toBeInTheDocument();
    expect(within(card).getByRole('button', { name: 'Confirm import' })).toBeDisabled();
    await userEvent.click(within(card).getByRole('button', { name: 'Check (preview)' }));
    const table = await within(card).findByRole('table', {}, { timeout: 15_000 });
    // What the server found, per file: mapping, onsets with conditions, channels, line noise.
    expect(within(table).getByText('O2: electrode bridged')).toBeInTheDocument();
    expect(within(table).getByText('4 (target, standard)')).toBeInTheDocument();
    // A no-break space before the unit (shared/src/number-format.ts): compared unnormalised.
    const exact = { normalizer: (text: string) => text };
    expect(within(table).getByText('50\u00a0Hz', exact)).toBeInTheDocument();
    expect(within(table).getByText('60\u00a0Hz', exact)).toBeInTheDocument();
    expect(
      within(card).getByText(/Checked, nothing stored yet\. 2 recordings, 0 with a problem/),
    ).toBeInTheDocument();
    await importWhenAllowed(card, 'Confirm import');
    expect(
      await within(card).findByText(/Imported: 2 recordings/, {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    expect(within(card).getByText('Nothing chosen yet')).toBeInTheDocument();
    expect(sent).toEqual([
      { dryRun: true, parts: ['files', 'files'] },
      { dryRun: false, parts: ['files', 'files'] },
    ]);
    // Each file goes as a `files` part named by its path in the folder (the server maps by it).
    const fileParts = append.mock.calls.filter(([name]) => name === 'files').map((call) => call[2]);
    expect(fileParts).toEqual([...paths, ...paths]);
    append.mockRestore();
  });

  it('shows the problems of a preview and keeps confirmation disabled', async () => {
    serveImport([
      () =>
        HttpResponse.json(
          preview(
            [
              file({
                participantCode: null,
                participant: null,
                problems: ['sub-ZZ0099: no participant ZZ0099 in this study'],
              }),
            ],
            { problems: ['study/README: sent more than once'] },
          ),
        ),
    ]);
    renderApp('/intake', meFor('technician'));
    const card = await chooseFolder([`${DIR}/sub-ZZ0099_ses-baseline_task-rest_eeg.edf`]);
    await userEvent.click(within(card).getByRole('button', { name: 'Check (preview)' }));
    expect(
      await within(card).findByText(
        'sub-ZZ0099: no participant ZZ0099 in this study',
        {},
        { timeout: 15_000 },
      ),
    ).toBeInTheDocument();
    expect(within(card).getByText('study/README: sent more than once')).toBeInTheDocument();
    expect(
      within(card).getByText(/Nothing was imported\. 1 recording, 1 with a problem/),
    ).toBeInTheDocument();
    expect(within(card).getByRole('button', { name: 'Confirm import' })).toBeDisabled();
  });

  it('shows the preview a refused import carries (422)', async () => {
    const refused = preview([file({ problems: ['RECORDING_REJECTED: not an EDF file'] })], {
      dryRun: false,
    });
    serveImport([
      () => HttpResponse.json(preview([file({})])),
      () => refusedImport('BIDS_IMPORT_FILES_INVALID', 'preview', refused),
    ]);
    renderApp('/intake', meFor('technician'));
    const card = await chooseFolder([`${DIR}/sub-AC0042_ses-baseline_task-rest_eeg.edf`]);
    await checkThenImport(card, 'Check (preview)', 'Confirm import');
    expect(
      await within(card).findByText('RECORDING_REJECTED: not an EDF file', {}, { timeout: 15_000 }),
    ).toBeInTheDocument();
    expect(within(card).getByRole('button', { name: /Confirm import$/ })).toBeDisabled();
  });
});
