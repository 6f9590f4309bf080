import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { SWRConfig } from 'swr';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AppProvider } from '../../../app/provider';
import { installCanvasMock } from '../../../components/charts/testing/canvas-mock';
import { setAccessToken } from '../../../lib/api-client';
import { installMswServer, server } from '../../../test/msw-server';
import { CHANNEL_CURVES, TASK_RASTER, TASK_RESULTS } from '../testing/review-fixtures';
import { OnsetCurveChart } from './onset-curve-chart';
import { TrialRaster } from './trial-raster';
import { errorResponse } from '../../../test/error-response';

vi.mock(
  '../../../components/charts/g2-plot',
  () => import('../../../components/charts/testing/fake-g2-plot'),
);

installMswServer();
const canvas = installCanvasMock();

const TASK = TASK_RESULTS.task!;
const RASTER_PATH = '/api/recordings/rec-task/results/raster';
const CURVES_PATH = '/api/recordings/rec-task/results/curves';

/** Every request the network saw, as path and query. */
const asked: string[] = [];
function onRequest({ request }: { request: Request }) {
  const url = new URL(request.url);
  asked.push(`${url.pathname}${url.search}`);
}
beforeEach(() => {
  asked.length = 0;
  server.events.on('request:start', onRequest);
  setAccessToken('test-access-token');
});
afterEach(() => {
  server.events.removeListener('request:start', onRequest);
});

function renderWithData(node: React.ReactNode) {
  return render(
    <AppProvider>
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>{node}</SWRConfig>
    </AppProvider>,
  );
}

/** The onset chart of a run with no region-of-interest channel left. */
function renderWithoutRoi() {
  renderWithData(
    <OnsetCurveChart
      recordingId="rec-task"
      runId="run-task"
      task={TASK}
      roiLabel="ROI: no channel"
      roiAvailable={false}
    />,
  );
}

function serveCurves() {
  server.use(
    http.get(CURVES_PATH, ({ request }) => {
      const curve = CHANNEL_CURVES[new URL(request.url).searchParams.get('channel') ?? ''];
      return curve === undefined
        ? HttpResponse.json({ message: 'no such curve' }, { status: 404 })
        : HttpResponse.json(curve);
    }),
  );
}

describe('the trial raster, loaded by its chart', { timeout: 30_000 }, () => {
  it('asks for the raster of its run once, then paints one cell per trial and time point', async () => {
    server.use(http.get(RASTER_PATH, () => HttpResponse.json(TASK_RASTER)));
    renderWithData(
      <TrialRaster recordingId="rec-task" runId="run-task" task={TASK} bandHz={[8, 13]} />,
    );
    expect(screen.getByLabelText('Loading the trial raster')).toBeInTheDocument();
    await waitFor(() => expect(canvas.putImageData).toBeGreaterThan(0));
    expect([canvas.lastImage?.width, canvas.lastImage?.height]).toEqual([8, 4]);
    expect(asked).toEqual([`${RASTER_PATH}?runId=run-task`]);
  });

  it('asks nothing when no trial was kept', async () => {
    renderWithData(
      <TrialRaster
        recordingId="rec-task"
        runId="run-task"
        task={{ ...TASK, raster: { trials: 0, points: 8 } }}
        bandHz={[8, 13]}
      />,
    );
    expect(screen.getByText('No trial was kept, so there is no raster.')).toBeInTheDocument();
    // Give a request the time to leave, had one been made.
    await new Promise((done) => setTimeout(done, 50));
    expect(asked).toEqual([]);
  });

  it('says when the raster could not be loaded, and draws it on "Try again"', async () => {
    let fail = true;
    server.use(
      http.get(RASTER_PATH, () =>
        fail
          ? HttpResponse.json(
              // A server failure: worth trying again (a 404 would not be; page-states.tsx).
              {
                statusCode: 503,
                code: 'UNAVAILABLE',
                message: 'No run run-task of recording rec-task.',
              },
              { status: 503 },
            )
          : HttpResponse.json(TASK_RASTER),
      ),
    );
    renderWithData(
      <TrialRaster recordingId="rec-task" runId="run-task" task={TASK} bandHz={[8, 13]} />,
    );
    expect(await screen.findByText('The trial raster could not be loaded')).toBeInTheDocument();
    expect(screen.getByRole('alert')).toHaveTextContent('No run run-task of recording rec-task.');
    fail = false;
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    await waitFor(() => expect(canvas.putImageData).toBeGreaterThan(0));
  });
});

describe("a channel's onset curve, asked for when picked", { timeout: 30_000 }, () => {
  it('draws the region from the results and asks for a channel only when the analyst picks it', async () => {
    serveCurves();
    renderWithData(
      <OnsetCurveChart recordingId="rec-task" runId="run-task" task={TASK} roiLabel="ROI: O1" />,
    );
    const figure = await screen.findByRole('figure', { name: 'Onset curve' });
    await within(figure).findByTestId('g2-plot', {}, { timeout: 15_000 });
    expect(screen.getByText('Mean, ROI: O1')).toBeInTheDocument();
    expect(asked).toEqual([]);

    await userEvent.click(screen.getByRole('combobox', { name: 'Curve shown' }));
    await userEvent.click(await screen.findByTitle('EEG O2-REF'));
    expect(await screen.findByText('Mean, EEG O2-REF')).toBeInTheDocument();
    await within(await screen.findByRole('figure', { name: 'Onset curve' })).findByTestId(
      'g2-plot',
    );
    expect(asked).toEqual([`${CURVES_PATH}?runId=run-task&channel=EEG+O2-REF`]);
    // The channel's own numbers: its baseline mean (10 − 0.4 Hz over −0.5…0 s) in the caption.
    expect(screen.getByRole('figure', { name: 'Onset curve' })).toHaveTextContent(
      'Baseline mean 9.60 Hz',
    );
  });

  it('asks for the first channel at once when no region-of-interest channel remains', async () => {
    serveCurves();
    renderWithoutRoi();
    expect(await screen.findByText('Mean, EEG O1-REF')).toBeInTheDocument();
    await waitFor(() =>
      expect(asked).toEqual([`${CURVES_PATH}?runId=run-task&channel=EEG+O1-REF`]),
    );
  });

  it('says when a curve could not be loaded, naming the channel', async () => {
    server.use(
      http.get(CURVES_PATH, () =>
        errorResponse(404, 'ANALYSIS_CHANNEL_CURVE_NOT_FOUND', 'no onset curve for "EEG O1-REF"'),
      ),
    );
    renderWithoutRoi();
    expect(
      await screen.findByText('The curve of EEG O1-REF could not be loaded'),
    ).toBeInTheDocument();
    expect(screen.getByRole('alert')).toHaveTextContent('no onset curve for "EEG O1-REF"');
  });
});
