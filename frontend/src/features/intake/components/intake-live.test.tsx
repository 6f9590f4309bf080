import type { RecordingView, RecordingEvent } from '@gyre/shared';
import { act, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import {
  page,
  participant,
  recording,
  useIntakeHandlers,
  visit,
  visitPath,
} from '../testing/intake-fixtures';

installMswServer();

const encoder = new TextEncoder();
const sse = (event: RecordingEvent) =>
  encoder.encode(`event: recording\ndata: ${JSON.stringify(event)}\n\n`);

/** A second visit of the same participant, with its own recordings. */
const visit2 = { ...visit, id: 'v-2', label: 'V2', visitDate: '2025-05-05' };

// Whole screens render slowly in jsdom on a shared 2-core machine.
describe('Intake, live', { timeout: 90_000 }, () => {
  it("shows exactly the chosen visit's recordings, never the previous visit's while the next loads", async () => {
    const byVisit: Record<string, RecordingView[]> = {
      'v-1': [recording({ id: 'r-a', fileName: 'first-visit-rest.edf' })],
      'v-2': [recording({ id: 'r-b', visitId: 'v-2', fileName: 'second-visit-rest.edf' })],
    };
    let releaseSecond: () => void = () => undefined;
    const secondAnswered = new Promise<void>((resolve) => (releaseSecond = resolve));
    useIntakeHandlers(() => []);
    server.use(
      http.get('/api/visits', () => HttpResponse.json(page([visit, visit2]))),
      http.get('/api/recordings', async ({ request }) => {
        const visitId = new URL(request.url).searchParams.get('visitId') ?? '';
        // The second visit's answer is held back, so a stale list would show meanwhile.
        if (visitId === 'v-2') await secondAnswered;
        return HttpResponse.json(page(byVisit[visitId] ?? []));
      }),
    );
    const { router } = renderApp(visitPath, meFor('technician'));
    expect(await screen.findByText('first-visit-rest.edf')).toBeInTheDocument();
    await act(() => router.navigate(`/intake?participant=${participant.id}&visit=${visit2.id}`));
    expect(await screen.findByText('Upload recordings for AC-0042, V2')).toBeInTheDocument();
    expect(screen.queryByText('first-visit-rest.edf')).not.toBeInTheDocument();
    releaseSecond();
    expect(await screen.findByText('second-visit-rest.edf')).toBeInTheDocument();
    expect(screen.queryByText('first-visit-rest.edf')).not.toBeInTheDocument();
  });

  it('follows a computing recording over its event stream to ready, without asking the list again meanwhile', async () => {
    let done = false;
    let listCalls = 0;
    let finish: () => void = () => undefined;
    const finished = new Promise<void>((resolve) => (finish = resolve));
    const streamAuth: Array<string | null> = [];
    useIntakeHandlers(() => {
      listCalls += 1;
      return [
        done
          ? recording({ state: 'ready', warnings: ['Channel Oz is flat and was left out.'] })
          : recording({ state: 'queued', progressPercent: null }),
      ];
    });
    server.use(
      http.get('/api/recordings/r-1/events', ({ request }) => {
        streamAuth.push(request.headers.get('Authorization'));
        const base = { recordingId: 'r-1', error: null };
        const stream = new ReadableStream<Uint8Array>({
          async start(controller) {
            controller.enqueue(sse({ ...base, state: 'queued', progressPercent: null }));
            controller.enqueue(sse({ ...base, state: 'computing', progressPercent: null }));
            controller.enqueue(sse({ ...base, state: 'computing', progressPercent: 40 }));
            await finished;
            done = true;
            controller.enqueue(sse({ ...base, state: 'ready', progressPercent: 100 }));
            controller.close();
          },
        });
        return new HttpResponse(stream, { headers: { 'Content-Type': 'text/event-stream' } });
      }),
    );
    renderApp(visitPath, meFor('technician'));
    const bar = await screen.findByRole('progressbar', {
      name: 'Computation progress of the resting recording',
    });
    await waitFor(() => expect(bar).toHaveAttribute('aria-valuenow', '40'));
    expect(screen.getByText('Computing')).toBeInTheDocument();
    // The stream carries the session's bearer token (EventSource could not send it).
    expect(streamAuth).toEqual(['Bearer test-access-token']);
    const before = listCalls;
    // Well past the 1.5 s poll: a live stream needs no polling.
    await new Promise((resolve) => setTimeout(resolve, 2500));
    expect(listCalls - before).toBeLessThanOrEqual(1);
    finish();
    expect(await screen.findByText('Ready with warnings')).toBeInTheDocument();
    expect(screen.getByText('Channel Oz is flat and was left out.')).toBeInTheDocument();
  });

  it('falls back to asking again when the stream cannot be opened', async () => {
    let calls = 0;
    useIntakeHandlers(() => {
      calls += 1;
      return [recording(calls < 3 ? { state: 'computing', progressPercent: 40 } : {})];
    });
    server.use(
      http.get('/api/recordings/r-1/events', () =>
        HttpResponse.json(
          { statusCode: 503, code: 'UNAVAILABLE', message: 'Not now.', details: null },
          { status: 503 },
        ),
      ),
    );
    renderApp(visitPath, meFor('technician'));
    expect(await screen.findByText('Computing')).toBeInTheDocument();
    expect(await screen.findByText('Ready', {}, { timeout: 8000 })).toBeInTheDocument();
    expect(calls).toBeGreaterThanOrEqual(3);
  });

  it('asks again instead of opening more streams than a browser has connections for', async () => {
    let calls = 0;
    let streams = 0;
    const computing = ['r-1', 'r-2', 'r-3', 'r-4'].map((id) =>
      recording({ id, state: 'computing', progressPercent: 10 }),
    );
    useIntakeHandlers(() => {
      calls += 1;
      return calls < 3 ? computing : computing.map((r) => ({ ...r, state: 'ready' as const }));
    });
    server.use(
      http.get('/api/recordings/:id/events', () => {
        streams += 1;
        return new HttpResponse(null, { status: 503 });
      }),
    );
    renderApp(visitPath, meFor('technician'));
    expect(await screen.findAllByText('Computing')).toHaveLength(4);
    await waitFor(() => expect(screen.getAllByText('Ready')).toHaveLength(4), { timeout: 8000 });
    // Four unsettled recordings are more than MAX_STREAMS (3): no stream was opened.
    expect(streams).toBe(0);
  });

  it('shows the file name, says a truncated file in plain words, and lets the rejected row be dismissed', async () => {
    // EDF spec (Kemp et al. 1992): file size = header + records × record bytes. A header of
    // 256 × (1 + 2 signals) = 768 bytes and 60 records of 1,024 bytes make 62,208 bytes; a copy
    // that stops 24 bytes into record 59 is 768 + 58 × 1,024 + 24 = 60,184 bytes long.
    const rejected = recording({
      id: 'r-cut',
      state: 'rejected',
      fileName: 'AC-0042 rest (cut).edf',
      sizeBytes: 60_184,
      progressPercent: null,
      rejection: {
        message:
          'data records: file ends 24 bytes into record 59 of 60 found, 1024 bytes per record expected (truncated last record)',
        field: 'data records',
        found: 'file ends 24 bytes into record 59 of 60',
        expected: '1024 bytes per record',
      },
    });
    useIntakeHandlers(() => [rejected, recording({ id: 'r-ok', fileName: 'AC-0042 rest.edf' })]);
    renderApp(visitPath, meFor('technician'));
    const row = (await screen.findByText('AC-0042 rest (cut).edf')).closest('tr') as HTMLElement;
    expect(screen.getByText('AC-0042 rest.edf')).toBeInTheDocument();
    expect(row).toHaveTextContent(
      'The file ends before its header says it should (expected 62,208 bytes, got 60,184 bytes). The copy may be incomplete: export it again from the recorder and upload the new file.',
    );
    // The server's exact words stay available.
    expect(row).toHaveTextContent(
      'Field: data records · found file ends 24 bytes into record 59 of 60 · expected 1024 bytes per record',
    );
    await userEvent.click(
      within(row).getByRole('button', { name: 'Dismiss the rejected AC-0042 rest (cut).edf' }),
    );
    await waitFor(() =>
      expect(screen.queryByText('AC-0042 rest (cut).edf')).not.toBeInTheDocument(),
    );
    expect(screen.getByText('AC-0042 rest.edf')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Show 1 dismissed rejected upload' }));
    expect(await screen.findByText('AC-0042 rest (cut).edf')).toBeInTheDocument();
  });
});
