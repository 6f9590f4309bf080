import type { VisitView } from '@gyre/shared';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { page, participant, recording, useIntakeHandlers, visit } from '../testing/intake-fixtures';

installMswServer();

describe('Intake', () => {
  it('validates the new visit before it is sent: both fields needed, label not taken', async () => {
    useIntakeHandlers(() => []);
    renderApp(`/intake?participant=${participant.id}`, meFor('technician'));
    await userEvent.click(await screen.findByRole('button', { name: 'Register a new visit' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Register visit' }));
    expect(await within(dialog).findByText('Give the visit a label.')).toBeInTheDocument();
    expect(within(dialog).getByText('Choose the date of the visit.')).toBeInTheDocument();
    await userEvent.type(within(dialog).getByLabelText('Visit label'), 'v1');
    expect(
      await within(dialog).findByText('AC-0042 already has a visit labelled v1.'),
    ).toBeInTheDocument();
  });

  it('registers a visit and selects it', async () => {
    let body: unknown = null;
    const created: VisitView = { ...visit, id: 'v-2', label: 'V2', visitDate: '2025-03-01' };
    let visits = [visit];
    useIntakeHandlers(() => []);
    server.use(
      http.get('/api/visits', () => HttpResponse.json(page(visits))),
      http.post('/api/visits', async ({ request }) => {
        body = await request.json();
        visits = [visit, created];
        return HttpResponse.json(created, { status: 201 });
      }),
    );
    const { router } = renderApp(`/intake?participant=${participant.id}`, meFor('technician'));
    await userEvent.click(await screen.findByRole('button', { name: 'Register a new visit' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.type(within(dialog).getByLabelText('Visit label'), ' V2 ');
    const date = within(dialog).getByLabelText('Visit date');
    await userEvent.click(date);
    await userEvent.type(date, '1 Mar 2025{Enter}');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Register visit' }));
    await waitFor(() =>
      expect(body).toEqual({ participantId: 'p-1', label: 'V2', visitDate: '2025-03-01' }),
    );
    await waitFor(() =>
      expect(new URLSearchParams(router.state.location.search).get('visit')).toBe('v-2'),
    );
    expect(await screen.findByText('Upload recordings for AC-0042, V2')).toBeInTheDocument();
  });

  it("shows the reader's message in plain words when a file is refused", async () => {
    useIntakeHandlers(() => []);
    server.use(
      http.post('/api/visits/v-1/recordings', () =>
        HttpResponse.json(
          {
            statusCode: 422,
            code: 'RECORDING_REJECTED',
            message: 'The header says 10 data records but the file holds 9.',
            details: {
              message: 'The header says 10 data records but the file holds 9.',
              field: 'number of data records',
              found: '10',
              expected: '9 (from the file size)',
            },
          },
          { status: 422 },
        ),
      ),
    );
    renderApp(`/intake?participant=${participant.id}&visit=${visit.id}`, meFor('technician'));
    await screen.findByText('Upload recordings for AC-0042, V1');
    const input = document.querySelector<HTMLInputElement>('input[type=file][accept*=".edf"]');
    expect(input).not.toBeNull();
    fireEvent.change(input as HTMLInputElement, {
      target: { files: [new File([new Uint8Array(512)], 'rest.edf')] },
    });
    const uploads = await screen.findByRole('list', { name: 'Uploads' });
    const alert = await within(uploads).findByRole('alert');
    expect(alert).toHaveTextContent('The header says 10 data records but the file holds 9.');
    expect(alert).toHaveTextContent(
      'Field: number of data records · found 10 · expected 9 (from the file size)',
    );
  });

  it('refuses a file that is not EDF without sending it', async () => {
    useIntakeHandlers(() => []);
    renderApp(`/intake?participant=${participant.id}&visit=${visit.id}`, meFor('technician'));
    await screen.findByText('Upload recordings for AC-0042, V1');
    const input = document.querySelector<HTMLInputElement>('input[type=file][accept*=".edf"]');
    // No upload handler: a request would be unhandled and fail the test.
    fireEvent.change(input as HTMLInputElement, {
      target: { files: [new File(['a,b'], 'onsets.xlsx')] },
    });
    expect(
      await screen.findByText('onsets.xlsx is not an EDF or EDF+ file, so it was not sent.'),
    ).toBeInTheDocument();
  });

  it('lists the recordings with their state and asks again until computing is over', async () => {
    let calls = 0;
    useIntakeHandlers(() => {
      calls += 1;
      return calls === 1
        ? [recording({ state: 'computing', progressPercent: 40 })]
        : [
            recording({
              state: 'ready',
              facts: {
                format: 'EDF+C',
                durationS: 300,
                recordCount: 300,
                recordDurationS: 1,
                channelLabels: ['O1', 'O2', 'Pz'],
                sampleRatesHz: [256, 256, 256],
                roiChannels: ['O1', 'O2', 'Pz'],
                annotationCount: 0,
                stimulusOnsetCount: 0,
                csvOnsetCount: null,
                warnings: [],
              },
            }),
          ];
    });
    renderApp(`/intake?participant=${participant.id}&visit=${visit.id}`, meFor('technician'));
    expect(await screen.findByText('Computing')).toBeInTheDocument();
    expect(screen.getByRole('progressbar')).toHaveAttribute('aria-valuenow', '40');
    // The list is asked again every 1.5 s while a recording is computing.
    expect(await screen.findByText('Ready', {}, { timeout: 4000 })).toBeInTheDocument();
    expect(
      screen.getByText(/EDF\+C · 300\.0 s · 3 channels · 256\.00 Hz · 1\.2 MB/),
    ).toBeInTheDocument();
  });

  it('shows an error with a retry when the participants cannot be loaded', async () => {
    let calls = 0;
    server.use(
      http.get('/api/participants', () => {
        calls += 1;
        return calls === 1
          ? HttpResponse.json(
              {
                statusCode: 500,
                code: 'INTERNAL',
                message: 'Something went wrong on the server; the error has been logged.',
                details: null,
              },
              { status: 500 },
            )
          : HttpResponse.json(page([participant]));
      }),
    );
    renderApp('/intake', meFor('technician'));
    expect(
      await screen.findByText('The participants could not be loaded', {}, { timeout: 15000 }),
    ).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(await screen.findByText('Participant and visit')).toBeInTheDocument();
  });
});
