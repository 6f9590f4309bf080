import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ParticipantView, RecordingView, VisitView } from '@gyre/shared';
import { E2E_PASSWORD } from './support/accounts';
import { openBrowser, screenshot, watchConsole } from './support/browser';
import { writeRestingEdf, writeTruncatedEdf } from './support/edf-files';
import { startGyre, type RunningGyre } from './support/gyre-server';
import { expectFitsWindow } from './support/page-width';
import { addParticipant, addVisit, setUpStudy } from './support/study-data';

// Generated test accounts of an invented study.
const ADMIN = { email: 'ida.admin@gyre.test', name: 'Ida Admin', password: E2E_PASSWORD };
const TECHNICIAN = { email: 'theo.tech@gyre.test', name: 'Theo Tech' };

const bytes = (n: number) => `${new Intl.NumberFormat('en-GB').format(n)} bytes`;

describe('Intake as a technician uses it, in Chromium on a real server', () => {
  let gyre: RunningGyre;
  let files: string;
  let browser: Awaited<ReturnType<typeof openBrowser>> | null = null;
  let technicianToken: string;
  let participant: ParticipantView;
  let visit1: VisitView;
  let visit2: VisitView;

  async function signIn(page: Page): Promise<void> {
    await page.goto(`${gyre.baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail').fill(TECHNICIAN.email);
    await page.getByLabel('Password', { exact: true }).fill(E2E_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText(/^Welcome, /).waitFor();
  }

  /** A resting recording uploaded through the API, as another technician's upload would be. */
  async function uploadByApi(visitId: string, path: string): Promise<RecordingView> {
    const form = new FormData();
    form.append('kind', 'resting');
    form.append('file', new Blob([readFileSync(path)]), basename(path));
    const response = await fetch(`${gyre.baseUrl}/api/visits/${visitId}/recordings`, {
      method: 'POST',
      headers: { authorization: `Bearer ${technicianToken}` },
      body: form,
    });
    expect(response.status).toBe(201);
    return (await response.json()) as RecordingView;
  }

  beforeAll(async () => {
    files = mkdtempSync(join(tmpdir(), 'gyre-e2e-intake-'));
    gyre = await startGyre();
    const team = await setUpStudy(gyre, {
      admin: ADMIN,
      study: { code: 'ALPHA-LIVE', name: 'Alpha followed live (invented)' },
      members: { technician: TECHNICIAN },
    });
    technicianToken = team.tokenOf('technician');
    participant = await addParticipant(gyre, technicianToken, {
      code: 'AC-0077',
      enrolmentDate: '2025-02-03',
    });
    const visit = (label: string, visitDate: string) =>
      addVisit(gyre, technicianToken, participant, { label, visitDate });
    visit1 = await visit('V1', '2025-02-03');
    visit2 = await visit('V2', '2025-05-05');
  });

  afterAll(async () => {
    await browser?.close();
    await gyre?.stop();
    if (files) rmSync(files, { recursive: true, force: true });
  });

  it('follows an upload live to ready, refuses a cut file in plain words, switches visit cleanly, and fits 390 px', async () => {
    browser = await openBrowser();
    const page = await browser.context.newPage();
    const problems = watchConsole(page);
    await page.setViewportSize({ width: 1440, height: 900 });
    const streams: string[] = [];
    page.on('response', (response) => {
      if (/\/api\/recordings\/[^/]+\/events$/.test(new URL(response.url()).pathname)) {
        streams.push(`${response.status()} ${response.headers()['content-type'] ?? ''}`);
      }
    });
    let documentLoads = 0;
    page.on('load', () => (documentLoads += 1));

    await signIn(page);
    await page.goto(`${gyre.baseUrl}/intake?participant=${participant.id}&visit=${visit1.id}`, {
      waitUntil: 'networkidle',
    });
    await page.getByText('Upload recordings for AC-0077, V1').waitFor();
    await page.getByRole('note', { name: 'Research use caution' }).waitFor();
    const loadsBefore = documentLoads;
    const dropzoneInput = page.locator('input[type=file][aria-label^="Drop "]');
    const uploads = page.getByRole('list', { name: 'Uploads' });
    const table = page.locator('.ant-card', { hasText: 'Recordings of this visit' });

    // First a file cut 1,000 bytes short (a visit's second resting file would be a replacement):
    // refused in plain words, with the expected and actual size.
    const cut = writeTruncatedEdf(files);
    const size = statSync(cut).size;
    await dropzoneInput.setInputFiles(cut);
    const refused = uploads.getByRole('alert');
    await refused.waitFor({ timeout: 60_000 });
    const refusal = await refused.innerText();
    expect(refusal).toContain(
      `The file ends before its header says it should (expected ${bytes(size + 1000)}, got ${bytes(size)}).`,
    );
    expect(refusal).toContain('export it again from the recorder and upload the new file');
    await table.getByText('cut-short.edf').waitFor();
    await screenshot(page, 'intake-live-1440');
    // Dismissed: off the upload list and off this view of the visit's recordings.
    await uploads.getByRole('button', { name: 'Dismiss cut-short.edf' }).click();
    await table.getByText('cut-short.edf').waitFor({ state: 'detached' });
    await expect(refused.count()).resolves.toBe(0);
    await table.getByRole('button', { name: 'Show 1 dismissed rejected upload' }).waitFor();

    // A resting file: its line and its row go queued → computing → ready with no reload.
    const resting = writeRestingEdf(files, { name: 'ac-0077-v1-rest.edf' });
    await dropzoneInput.setInputFiles(resting);
    await uploads.getByText('Received and checked.').waitFor({ timeout: 60_000 });
    await uploads.locator('[data-state^="ready"]').waitFor({ timeout: 120_000 });
    await table.locator('[data-state^="ready"]').waitFor({ timeout: 10_000 });
    expect(documentLoads).toBe(loadsBefore);
    // The state came over the server's event stream, opened with the session's token.
    expect(streams.length).toBeGreaterThan(0);
    expect(streams[0]).toMatch(/^200 text\/event-stream/);
    await table.getByText('ac-0077-v1-rest.edf').waitFor();
    await screenshot(page, 'intake-live-1440-ready');

    // Another visit: only its own recording, none of V1's, and none of V1's upload lines.
    await uploadByApi(visit2.id, writeRestingEdf(files, { name: 'ac-0077-v2-rest.edf' }));
    await page.locator('#intake-visit').click();
    await page.getByTitle(/^V2 · /).click();
    await page.getByText('Upload recordings for AC-0077, V2').waitFor();
    // The visit list has closed (its closing animation done) before any width is measured.
    await page.locator('.ant-select-dropdown:not(.ant-select-dropdown-hidden)').waitFor({
      state: 'detached',
    });
    await table.getByText('ac-0077-v2-rest.edf').waitFor();
    await expect(table.getByText('ac-0077-v1-rest.edf').count()).resolves.toBe(0);
    await expect(uploads.count()).resolves.toBe(0);
    await table.locator('[data-state^="ready"]').waitFor({ timeout: 120_000 });
    expect(documentLoads).toBe(loadsBefore);

    // 390 px: nothing scrolls sideways, the table, the bulk-upload panel and the due card included.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.getByRole('columnheader', { name: 'Recordings' }).waitFor();
    await expectFitsWindow(page, 'Intake at 390 px');
    await screenshot(page, 'intake-live-390');

    // The refusal is a 422 answer, which Chromium logs as a failed load; nothing else may.
    expect(problems).toEqual([
      'error: Failed to load resource: the server responded with a status of 422 (Unprocessable Entity)',
    ]);
  });
});
