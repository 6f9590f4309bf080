import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http } from 'msw';
import { expect } from 'vitest';
import { STUDY } from '../../../test/fixtures';
import { server } from '../../../test/msw-server';
import { errorResponse } from '../../../test/error-response';

/** What one request to a study import sent: whether it was a dry run, and its part names in order. */
export interface SentImport {
  dryRun: boolean;
  parts: string[];
}

/**
 * Serves `POST /api/studies/:studyId/<endpoint>` with `answers`, one a request in turn (a request
 * beyond them fails the test). Returns what each request sent, filled in as they come.
 */
export function serveStudyImport(endpoint: string, answers: Array<() => Response>): SentImport[] {
  const sent: SentImport[] = [];
  server.use(
    http.post(`/api/studies/${STUDY.id}/${endpoint}`, async ({ request }) => {
      const dryRun = new URL(request.url).searchParams.get('dryRun') === 'true';
      const form = await request.formData();
      sent.push({ dryRun, parts: [...form.keys()] });
      const answer = answers[sent.length - 1];
      if (answer === undefined) throw new Error(`Request ${sent.length} was not expected`);
      return answer();
    }),
  );
  return sent;
}

/** The 422 of an import the server refused: nothing stored, the outcome in `details[field]`. */
export function refusedImport(code: string, field: string, outcome: unknown): Response {
  return errorResponse(422, code, 'Nothing was imported', { [field]: outcome });
}

/** The import card titled `title`, once the page shows it (slow in jsdom on a busy machine). */
export async function findImportCard(title: string): Promise<HTMLElement> {
  const heading = await screen.findByText(title, {}, { timeout: 15_000 });
  return heading.closest('.ant-card') as HTMLElement;
}

/** Waits until the check allows the import (button `confirm` enabled), then starts it. */
export async function importWhenAllowed(card: HTMLElement, confirm: string) {
  await waitFor(() => expect(within(card).getByRole('button', { name: confirm })).toBeEnabled(), {
    timeout: 15_000,
  });
  await userEvent.click(within(card).getByRole('button', { name: confirm }));
}

/** Checks the choice, waits until the check allows the import, then starts it. */
export async function checkThenImport(card: HTMLElement, check: string, confirm: string) {
  await userEvent.click(within(card).getByRole('button', { name: check }));
  await importWhenAllowed(card, confirm);
}
