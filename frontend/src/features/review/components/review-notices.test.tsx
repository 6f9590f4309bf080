import type {
  RecordingView,
  RecordingResultsView,
  VisitAnalysisOverrideChange,
  VisitFlagView,
} from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it, vi } from 'vitest';
import { installCanvasMock } from '../../../components/charts/testing/canvas-mock';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import {
  NO_FLAG,
  NO_OVERRIDE,
  NO_ROI,
  PARTIAL_ROI,
  PARTICIPANT,
  RECORDINGS,
  REST_RESULTS,
  SETTINGS,
  TASK_RESULTS,
  VISIT,
} from '../testing/review-fixtures';
import { serveReview, type ReviewServed } from '../testing/serve-review';
import { recordingOfKind } from './review-page';
import { errorResponse } from '../../../test/error-response';

vi.mock(
  '../../../components/charts/g2-plot',
  () => import('../../../components/charts/testing/fake-g2-plot'),
);

installMswServer();
installCanvasMock();

function taskWith(
  change: Partial<RecordingResultsView['run']>,
  rest: Partial<RecordingResultsView> = {},
) {
  return { ...TASK_RESULTS, ...rest, run: { ...TASK_RESULTS.run, ...change } };
}

function flagWith(suggestion: Partial<NonNullable<VisitFlagView['suggestion']>>): VisitFlagView {
  return { ...NO_FLAG, suggestion: { ...NO_FLAG.suggestion!, ...suggestion } };
}

async function openReview(served: ReviewServed, role: 'analyst' | 'monitor' = 'analyst') {
  serveReview(served);
  renderApp(`/review/${VISIT.id}`, meFor(role));
  await screen.findByText(`Review · ${PARTICIPANT.code} · ${VISIT.label}`, {}, { timeout: 15_000 });
  await screen.findByTestId('roi-delta-f', {}, { timeout: 15_000 });
  await screen.findByRole('region', { name: "Computation's suggestion" }, { timeout: 15_000 });
}

const channelRow = (name: string) => {
  const table = screen.getByRole('table', { name: 'Per-channel task results' });
  const cell = within(table).getByText(name);
  return cell.closest('tr') as HTMLTableRowElement;
};

describe('Review: what the numbers rest on', { timeout: 60_000 }, () => {
  it('says on the header, the table and the suggestion which region channels were left out and why', async () => {
    await openReview({
      task: taskWith({ roiUsage: PARTIAL_ROI }),
      flag: flagWith({ roiUsage: PARTIAL_ROI }),
    });
    const sentence =
      'Region of interest from EEG O1-REF, EEG Pz-REF only; left out EEG O2-REF (flat).';
    expect(screen.getByTestId('source-task')).toHaveTextContent(sentence);
    expect(screen.getByTestId('source-resting')).not.toHaveTextContent('left out');
    expect(screen.getByLabelText('Region of interest of this table')).toHaveTextContent(sentence);
    // ROI badges only on the channels the run averaged.
    expect(within(channelRow('O1')).getByText('ROI')).toBeInTheDocument();
    expect(within(channelRow('Pz')).getByText('ROI')).toBeInTheDocument();
    expect(within(channelRow('O2')).queryByText('ROI')).not.toBeInTheDocument();
    expect(within(channelRow('O2')).getByText('left out of ROI: flat')).toBeInTheDocument();
    expect(within(channelRow('Fz')).queryByText(/ROI/)).not.toBeInTheDocument();
    expect(screen.getByTestId('suggestion-roi')).toHaveTextContent(sentence);
    expect(screen.getByRole('region', { name: "Computation's suggestion" })).toHaveTextContent(
      'Suggests a slowing flag',
    );
    expect(screen.getByTestId('roi-delta-f')).toHaveTextContent(
      '\u22120.31 Hz' + 'from EEG O1-REF, EEG Pz-REF only',
    );
  });

  it('says "No region-of-interest channel remains" on every surface and lets the analyst choose channels and re-run', async () => {
    const puts: VisitAnalysisOverrideChange[] = [];
    server.use(
      http.put(`/api/visits/${VISIT.id}/analysis-override`, async ({ request }) => {
        const change = (await request.json()) as VisitAnalysisOverrideChange;
        puts.push(change);
        if (puts.length === 1) {
          return errorResponse(
            409,
            'ANALYSIS_OVERRIDE_UNCHANGED',
            'Nothing changed: the visit already uses these choices.',
            { visitId: VISIT.id, revision: 0 },
          );
        }
        const { reason, ...values } = change;
        return HttpResponse.json({
          ...NO_OVERRIDE,
          ...values,
          revision: 1,
          reason,
          updatedById: 'user-analyst',
          updatedAt: '2025-02-04T09:00:00.000Z',
        });
      }),
    );
    await openReview({
      task: taskWith(
        {
          roiUsage: NO_ROI,
          roiDeltaFHz: null,
          roiCiHz: null,
          roiPValue: null,
          suggestsSlowing: null,
        },
        { task: null },
      ),
      flag: flagWith({
        roiUsage: NO_ROI,
        suggestsSlowing: false,
        roiDeltaFHz: null,
        roiCiHz: null,
      }),
    });
    const phrase = 'No region-of-interest channel remains';
    expect(screen.getByTestId('source-task')).toHaveTextContent(phrase);
    const taskCard = screen.getByLabelText('Task results');
    expect(within(taskCard).getByRole('alert')).toHaveTextContent(
      `${phrase}Left out: EEG O1-REF (saturated: held at the converter's limit), EEG O2-REF (flat), EEG Pz-REF (saturated: held at the converter's limit).`,
    );
    expect(screen.getByTestId('roi-delta-f')).toHaveTextContent(`— (${phrase})`);
    expect(screen.queryByText(/no task curves/i)).not.toBeInTheDocument();
    expect(screen.queryByText(/No onset curves/)).not.toBeInTheDocument();
    expect(screen.getByLabelText('Region of interest of this table')).toHaveTextContent(phrase);
    expect(within(channelRow('O1')).queryByText('ROI')).not.toBeInTheDocument();
    expect(screen.getByRole('region', { name: "Computation's suggestion" })).toHaveTextContent(
      `${phrase}, so the computation has nothing to suggest.`,
    );

    await userEvent.click(
      within(taskCard).getByRole('button', { name: 'Choose channels and re-run' }),
    );
    const dialog = await screen.findByRole('dialog', { name: "This visit's analysis choices" });
    await userEvent.click(within(dialog).getByLabelText('Channels chosen for this visit'));
    // The channels on offer are the file's, by their 10-10 names.
    await userEvent.click(within(dialog).getByLabelText('Channels for this visit'));
    await userEvent.click(await screen.findByTitle('Fz (EEG Fz-REF)'));
    await userEvent.click(within(dialog).getByLabelText('Why this visit needs its own choices'));
    await userEvent.paste('O1, O2 and Pz unusable in this session');
    await userEvent.click(
      within(dialog).getByRole('button', { name: 'Save and re-run this visit' }),
    );
    const unchanged = await within(dialog).findByRole('alert');
    expect(unchanged).toHaveTextContent('Nothing changed');
    expect(unchanged).toHaveTextContent('Nothing was saved or re-run.');
    expect(puts[0]).toEqual({
      roi: ['O1', 'O2', 'Pz', 'Fz'],
      bandHz: null,
      onsetLabel: null,
      reason: 'O1, O2 and Pz unusable in this session',
    });

    await userEvent.click(
      within(dialog).getByRole('button', { name: 'Save and re-run this visit' }),
    );
    const choices = screen.getByLabelText('Visit analysis choices');
    await waitFor(() => expect(choices).toHaveTextContent('O1, O2, Pz, Fz'));
    expect(choices).toHaveTextContent('O1, O2 and Pz unusable in this session');
    expect(puts).toHaveLength(2);
  });

  it('shows "computed with older settings" only when the run lists what would change', async () => {
    // A newer settings version alone is no reason for a notice.
    await openReview({
      task: taskWith({ settingsVersion: 1, staleSettings: [] }),
      settings: { ...SETTINGS, id: 'set-3', version: 3, postWindowS: [0.3, 0.9] },
    });
    expect(
      await within(screen.getByLabelText('Visit analysis choices')).findByText(/version 3/),
    ).toBeInTheDocument();
    expect(screen.queryByLabelText('Computed with older settings')).not.toBeInTheDocument();
    expect(screen.queryByText(/older settings/)).not.toBeInTheDocument();
  });

  it('lists what newer settings would compute differently, with a re-run for the analyst', async () => {
    await openReview({
      task: taskWith({
        staleSettings: ['post window 0.2–0.8 s → 0.3–0.9 s', 'band 8–13 Hz → 8–12 Hz'],
      }),
    });
    const notice = screen.getByLabelText('Computed with older settings');
    expect(
      within(notice)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['post window 0.2–0.8 s → 0.3–0.9 s', 'band 8–13 Hz → 8–12 Hz']);
    expect(
      within(notice).getByRole('button', { name: 'Re-run with the current settings' }),
    ).toBeInTheDocument();
    // Only the task run is stale.
    expect(screen.getAllByLabelText('Computed with older settings')).toHaveLength(1);
  });

  it('names the superseded recording and why, the confirmed kind, and an automatic recomputation', async () => {
    const current: RecordingView = {
      ...RECORDINGS[0],
      replacesId: 'rec-task-old',
      replacementReason: 'Electrode O1 came loose',
      kindConfirmed: true,
    };
    const superseded: RecordingView = {
      ...RECORDINGS[0],
      id: 'rec-task-old',
      state: 'superseded',
      latestRunId: 'run-task-old',
      supersededById: 'rec-task',
      createdAt: '2025-02-03T09:00:00.000Z',
    };
    // No handler serves the superseded recording's results: asking for them would fail the test.
    await openReview({
      recordings: [superseded, current, RECORDINGS[1]],
      task: {
        ...taskWith({ trigger: 'rest-changed', bandSource: 'iaf' }),
        source: {
          ...TASK_RESULTS.source,
          replacesId: 'rec-task-old',
          replacementReason: 'Electrode O1 came loose',
        },
      },
    });
    const source = screen.getByTestId('source-task');
    expect(source).toHaveTextContent(
      "automatically, because the visit's resting IAF arrived or changed",
    );
    expect(source).toHaveTextContent(
      'It replaced an earlier task recording uploaded 3 Feb 2025, 09:00:00, now superseded: “Electrode O1 came loose”',
    );
    expect(source).toHaveTextContent(
      'The technician confirmed the kind although the file looked like a resting recording.',
    );
    expect(
      within(screen.getByLabelText('Task results')).getByText(
        "Recomputed automatically because the visit's resting IAF arrived or changed: the band follows the resting IAF ± 2 Hz.",
      ),
    ).toBeInTheDocument();
    expect(screen.getByTestId('source-resting')).not.toHaveTextContent('automatically');
  });

  it('shows a monitor the same doubts without a way to change the choices', async () => {
    await openReview(
      { task: taskWith({ roiUsage: NO_ROI, roiDeltaFHz: null }), rest: REST_RESULTS },
      'monitor',
    );
    expect(within(screen.getByLabelText('Task results')).getByRole('alert')).toHaveTextContent(
      'No region-of-interest channel remains',
    );
    expect(screen.queryByRole('button', { name: /Choose channels/ })).not.toBeInTheDocument();
    expect(
      screen.queryByRole('button', { name: "Change this visit's choices" }),
    ).not.toBeInTheDocument();
  });
});

describe('recordingOfKind', () => {
  const at = (id: string, state: RecordingView['state'], createdAt: string): RecordingView => ({
    ...RECORDINGS[0],
    id,
    state,
    createdAt,
  });

  it('never picks a superseded recording while a current one exists', () => {
    const picked = recordingOfKind(
      [
        at('old', 'superseded', '2025-02-03T09:00:00.000Z'),
        at('new', 'queued', '2025-02-03T10:00:00.000Z'),
      ],
      'task',
    );
    expect(picked?.id).toBe('new');
  });

  it('keeps the current recording while its replacement is still being checked', () => {
    const picked = recordingOfKind(
      [
        at('current', 'ready', '2025-02-03T09:00:00.000Z'),
        at('incoming', 'validating', '2025-02-03T10:00:00.000Z'),
        at('refused', 'rejected', '2025-02-03T11:00:00.000Z'),
      ],
      'task',
    );
    expect(picked?.id).toBe('current');
  });
});
