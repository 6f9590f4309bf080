import type { VisitView } from '@gyre/shared';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { errorResponse, failingOnce } from '../../../test/error-response';
import { meFor, STUDY } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { page, participant, recording, useIntakeHandlers, visit } from '../testing/intake-fixtures';

installMswServer();

describe('Intake', { timeout: 60_000 }, () => {
  it('validates the new visit before it is sent: a planned visit and a date needed', async () => {
    useIntakeHandlers(() => []);
    renderApp(`/intake?participant=${participant.id}`, meFor('technician'));
    await userEvent.click(await screen.findByRole('button', { name: 'Register a new visit' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Register visit' }));
    expect(
      await within(dialog).findByText('Choose the planned visit, or "Unscheduled".'),
    ).toBeInTheDocument();
    expect(within(dialog).getByText('Choose the date of the visit.')).toBeInTheDocument();
    // An unscheduled visit needs a label of its own, not one the participant has.
    await userEvent.click(within(dialog).getByRole('combobox', { name: 'Planned visit' }));
    await userEvent.click(await screen.findByTitle('Unscheduled visit (outside the schedule)'));
    await userEvent.type(await within(dialog).findByLabelText('Visit label'), 'v1');
    expect(
      await within(dialog).findByText('AC-0042 already has a visit labelled v1.'),
    ).toBeInTheDocument();
  });

  it('registers a visit on a planned visit, showing it is late before it is sent', async () => {
    let body: unknown = null;
    const created: VisitView = {
      ...visit,
      id: 'v-2',
      label: 'Week 12',
      visitDate: '2025-04-30',
      plannedVisitId: 'pv-12',
      schedule: {
        plannedVisitId: 'pv-12',
        plannedVisitName: 'Week 12',
        studyDay: 100,
        targetDay: 84,
        daysFromTarget: 16,
        window: 'late',
      },
    };
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
    expect(await screen.findByLabelText('Enrolment and group')).toHaveTextContent(
      'Enrolled 20 Jan 2025 · Arm A',
    );
    await userEvent.click(await screen.findByRole('button', { name: 'Register a new visit' }));
    const dialog = await screen.findByRole('dialog');
    await userEvent.click(within(dialog).getByRole('combobox', { name: 'Planned visit' }));
    await userEvent.click(await screen.findByTitle('Week 12 · day 84, −14/+14 days'));
    const date = within(dialog).getByLabelText('Visit date');
    await userEvent.click(date);
    await userEvent.type(date, '30 Apr 2025{Enter}');
    // Enrolled 2025-01-20: 2025-04-30 is day 100; Week 12's window ends on day 98
    // (Python: date(2025, 4, 30) - date(2025, 1, 20) = 100 days).
    const status = await within(dialog).findByRole('status', { name: 'Window status' });
    expect(status).toHaveTextContent('Late by 16 days');
    expect(status).toHaveTextContent('Day 100 (target 84)');
    expect(within(dialog).queryByLabelText('Visit label')).not.toBeInTheDocument();
    await userEvent.click(within(dialog).getByRole('button', { name: 'Register visit' }));
    await waitFor(() =>
      expect(body).toEqual({
        participantId: 'p-1',
        plannedVisitId: 'pv-12',
        visitDate: '2025-04-30',
      }),
    );
    await waitFor(() =>
      expect(new URLSearchParams(router.state.location.search).get('visit')).toBe('v-2'),
    );
    expect(await screen.findByText('Upload recordings for AC-0042, Week 12')).toBeInTheDocument();
    expect(screen.getByLabelText('Visit schedule')).toHaveTextContent('Late by 16 days');
  });

  it('shows what is due at the site and opens the participant from it', async () => {
    useIntakeHandlers(() => [], {
      studyId: STUDY.id,
      asOf: '2025-04-20',
      withoutEnrolmentDate: 2,
      participants: [
        {
          participantId: participant.id,
          participantCode: 'AC-0042',
          siteId: participant.siteId,
          groupId: 'g-1',
          enrolmentDate: '2025-01-20',
          due: [
            {
              plannedVisitId: 'pv-12',
              plannedVisitName: 'Week 12',
              targetDay: 84,
              opens: '2025-03-31',
              target: '2025-04-14',
              closes: '2025-04-28',
              status: 'open',
              daysOverdue: 0,
            },
          ],
        },
      ],
    });
    const { router } = renderApp('/intake', meFor('technician'));
    const card = await screen.findByRole('region', { name: 'Due' }, { timeout: 15_000 });
    expect(await within(card).findByText('Due until 28 Apr 2025')).toBeInTheDocument();
    expect(card).toHaveTextContent('Week 12');
    expect(card).toHaveTextContent('window 31 Mar 2025 – 28 Apr 2025');
    expect(card).toHaveTextContent('2 participants have no enrolment date');
    await userEvent.click(within(card).getByRole('button', { name: 'Open AC-0042' }));
    await waitFor(() =>
      expect(new URLSearchParams(router.state.location.search).get('participant')).toBe('p-1'),
    );
  });

  it('says so when nothing is due', async () => {
    useIntakeHandlers(() => []);
    renderApp('/intake', meFor('technician'));
    const card = await screen.findByRole('region', { name: 'Due' }, { timeout: 15_000 });
    expect(
      await within(card).findByText('No planned visit is due or overdue at your site today.'),
    ).toBeInTheDocument();
  });

  it('registers a participant with an enrolment date and a group', async () => {
    let body: unknown = null;
    useIntakeHandlers(() => []);
    server.use(
      http.post('/api/participants', async ({ request }) => {
        body = await request.json();
        return HttpResponse.json(
          {
            ...participant,
            id: 'p-2',
            code: 'AC-0043',
            enrolmentDate: '2025-03-03',
            groupId: 'g-2',
          },
          { status: 201 },
        );
      }),
    );
    renderApp('/intake', meFor('technician'));
    await userEvent.click(
      await screen.findByRole('button', { name: 'Register a new participant' }),
    );
    const dialog = await screen.findByRole('dialog');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Register participant' }));
    expect(await within(dialog).findByText('Choose the enrolment date.')).toBeInTheDocument();
    await userEvent.type(within(dialog).getByLabelText('Participant code'), 'ac-0043');
    const date = within(dialog).getByLabelText('Enrolment date');
    await userEvent.click(date);
    await userEvent.type(date, '3 Mar 2025{Enter}');
    await userEvent.click(within(dialog).getByRole('combobox', { name: 'Group' }));
    await userEvent.click(await screen.findByTitle('Arm B'));
    await userEvent.click(within(dialog).getByRole('button', { name: 'Register participant' }));
    await waitFor(() =>
      expect(body).toEqual({
        code: 'AC-0043',
        siteId: participant.siteId,
        enrolmentDate: '2025-03-03',
        groupId: 'g-2',
      }),
    );
  });

  it("shows the reader's message in plain words when a file is refused", async () => {
    useIntakeHandlers(() => []);
    server.use(
      http.post('/api/visits/v-1/recordings', () =>
        errorResponse(
          422,
          'RECORDING_REJECTED',
          'The header says 10 data records but the file holds 9.',
          {
            message: 'The header says 10 data records but the file holds 9.',
            field: 'number of data records',
            found: '10',
            expected: '9 (from the file size)',
          },
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
      await screen.findByText(
        'onsets.xlsx is not an EDF, EDF+, BDF or BDF+ file, so it was not sent.',
      ),
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
    useIntakeHandlers(() => []);
    server.use(
      http.get(
        '/api/participants',
        failingOnce(
          500,
          'INTERNAL',
          'Something went wrong on the server; the error has been logged.',
          () => HttpResponse.json(page([participant])),
        ),
      ),
    );
    renderApp('/intake', meFor('technician'));
    expect(
      await screen.findByText('The participants could not be loaded', {}, { timeout: 15000 }),
    ).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Try again' }));
    expect(await screen.findByText('Participant and visit')).toBeInTheDocument();
  });
});
