import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { recording, useIntakeHandlers, visit, visitPath } from '../testing/intake-fixtures';
import { errorResponse } from '../../../test/error-response';

installMswServer();

/** The text fields and the file name of each upload the server received, in order. */
function serveUploads(answers: Array<(fields: Record<string, string>) => Response>) {
  const sent: Array<Record<string, string>> = [];
  server.use(
    http.post(`/api/visits/${visit.id}/recordings`, async ({ request }) => {
      const form = await request.formData();
      const fields: Record<string, string> = {};
      for (const [name, value] of form.entries()) {
        // jsdom's XMLHttpRequest carries neither the file's name nor its bytes through.
        fields[name] = typeof value === 'string' ? value : 'a file';
      }
      sent.push(fields);
      const answer = answers[sent.length - 1];
      if (answer === undefined) throw new Error(`Upload ${sent.length} was not expected`);
      return answer(fields);
    }),
  );
  return sent;
}

const accepted = () => HttpResponse.json(recording({ state: 'queued' }), { status: 201 });

async function dropFile(name: string) {
  await screen.findByText('Upload recordings for AC-0042, V1');
  const input = document.querySelector<HTMLInputElement>('input[type=file][accept*=".edf"]');
  expect(input).not.toBeNull();
  fireEvent.change(input as HTMLInputElement, {
    target: { files: [new File([new Uint8Array(512)], name)] },
  });
  return screen.findByRole('list', { name: 'Uploads' });
}

const kindUnconfirmed = () =>
  errorResponse(
    422,
    'RECORDING_KIND_UNCONFIRMED',
    'kind: this file holds 3 stimulus onsets (EDF+ annotations), so it looks like a task recording, not a resting one. Upload it as task, or confirm that it is a resting recording.',
    { kind: 'resting', onsetCount: 3, found: '3 stimulus onsets', expected: 'no stimulus onsets' },
  );

// Whole screens render slowly in jsdom on a shared 2-core machine.
describe('Intake uploads', { timeout: 60_000 }, () => {
  it('says in plain words that a resting file holds onsets, and resends it once the kind is confirmed', async () => {
    useIntakeHandlers(() => []);
    const sent = serveUploads([kindUnconfirmed, accepted]);
    renderApp(visitPath, meFor('technician'));
    const uploads = await dropFile('rest.edf');
    const alert = await within(uploads).findByRole('alert');
    expect(alert).toHaveTextContent('this file looks like a task recording');
    expect(alert).toHaveTextContent(
      'This file holds 3 stimulus onsets (EDF+ annotations), so it looks like a task recording',
    );
    expect(alert).toHaveTextContent('found 3 stimulus onsets · expected no stimulus onsets');
    const send = within(uploads).getByRole('button', { name: 'Send as resting, kind confirmed' });
    // Nothing goes out again until the technician ticks the confirmation.
    expect(send).toBeDisabled();
    await userEvent.click(
      within(uploads).getByRole('checkbox', {
        name: 'I confirm that this is a resting recording, although the file holds 3 stimulus onsets.',
      }),
    );
    await userEvent.click(send);
    const line = (await within(uploads).findByText('Received and checked.')).closest('li');
    expect(line).toHaveTextContent('The confirmed kind stays on the recording as a warning.');
    expect(sent).toEqual([
      { kind: 'resting', file: 'a file' },
      { kind: 'resting', confirmKind: 'true', file: 'a file' },
    ]);
  });

  it('sends the same file as the other kind when the technician picks it, without a confirmation', async () => {
    useIntakeHandlers(() => []);
    const sent = serveUploads([kindUnconfirmed, accepted]);
    renderApp(visitPath, meFor('technician'));
    const uploads = await dropFile('session.edf');
    await userEvent.click(
      await within(uploads).findByRole('button', { name: 'Send it as a task recording' }),
    );
    await within(uploads).findByText(/Received and checked/);
    expect(sent[1]).toEqual({ kind: 'task', file: 'a file' });
  });

  it('replaces the current recording of the kind only with a reason, naming the one replaced', async () => {
    const earlier = recording({ id: 'r-old', createdAt: '2025-02-03T10:05:00.000Z' });
    useIntakeHandlers(() => [earlier]);
    const sent = serveUploads([
      () =>
        errorResponse(
          409,
          'RECORDING_KIND_TAKEN',
          'This visit already has a resting recording (r-old, ready).',
          { kind: 'resting', recordingId: 'r-old' },
        ),
      accepted,
    ]);
    renderApp(visitPath, meFor('technician'));
    const uploads = await dropFile('rest-again.edf');
    expect(await within(uploads).findByRole('alert')).toHaveTextContent(
      'this visit already has a resting recording, uploaded 3 Feb 2025',
    );
    await userEvent.click(within(uploads).getByRole('button', { name: 'Replace it' }));
    const replace = within(uploads).getByRole('button', { name: 'Replace and send' });
    await userEvent.click(replace);
    expect(await within(uploads).findByText('A reason is required.')).toBeInTheDocument();
    const reason = within(uploads).getByLabelText('Why replace the earlier resting recording?');
    await userEvent.click(reason);
    await userEvent.paste('O1 off');
    await userEvent.click(replace);
    expect(
      await within(uploads).findByText('Write at least 10 characters (6 so far).'),
    ).toBeInTheDocument();
    expect(sent).toHaveLength(1);
    await userEvent.clear(reason);
    await userEvent.paste(' Electrode O1 came loose halfway ');
    await userEvent.click(replace);
    expect(
      (await within(uploads).findByText('Received and checked.')).closest('li'),
    ).toHaveTextContent('It replaces the earlier recording, which stays listed as superseded.');
    expect(sent[1]).toEqual({
      kind: 'resting',
      replaces: 'r-old',
      replacementReason: 'Electrode O1 came loose halfway',
      file: 'a file',
    });
  });

  it('sends nothing when the technician keeps the earlier recording', async () => {
    useIntakeHandlers(() => [recording({ id: 'r-old' })]);
    const sent = serveUploads([
      () =>
        errorResponse(409, 'RECORDING_KIND_TAKEN', 'This visit already has a resting recording.', {
          kind: 'resting',
          recordingId: 'r-old',
        }),
    ]);
    renderApp(visitPath, meFor('technician'));
    const uploads = await dropFile('rest-again.edf');
    await userEvent.click(
      await within(uploads).findByRole('button', { name: 'Keep the earlier recording' }),
    );
    expect(
      await within(uploads).findByText(
        "Not sent; the earlier recording stays the visit's current one.",
      ),
    ).toBeInTheDocument();
    await waitFor(() => expect(sent).toHaveLength(1));
  });
});
