import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type {
  Page as ListPage,
  ParticipantView,
  RecordingDto,
  RecordingKind,
  ReportRevisionDto,
  ReportSignOffDto,
  SiteView,
  StudyView,
  VisitView,
} from '@gyre/shared';
import { waitForMail } from '../../backend/test/helpers/mail-catcher';
import {
  api,
  createFirstAdmin,
  E2E_PASSWORD,
  inviteAndAccept,
  signInApi,
} from './support/accounts';
import { edfWriter } from './support/edf-files';
import { signInThroughPage } from './support/sign-in-page';
import { openBrowser, screenshot, watchConsole } from './support/browser';
import { startGyre, type RunningGyre } from './support/gyre-server';

const SAMPLE_RATE_HZ = 256;

/**
 * Generated test data: 20 µV alpha at 10 Hz on four posterior 10-10 channels over ±3 µV of
 * noise; in the task recording the frequency dips by 0.6 Hz from +0.1 to +0.9 s after each
 * onset (a smooth dip), its phase the running integral of the frequency.
 */
function writeRecording(kind: RecordingKind, durationS: number): Uint8Array {
  const n = SAMPLE_RATE_HZ * durationS;
  const onsetsS: number[] = [];
  if (kind === 'task') for (let t = 4; t <= durationS - 4; t += 3) onsetsS.push(t);
  const frequencyHz = new Float64Array(n).fill(10);
  for (const onset of onsetsS) {
    for (
      let i = Math.floor((onset + 0.1) * SAMPLE_RATE_HZ);
      i < (onset + 0.9) * SAMPLE_RATE_HZ;
      i++
    ) {
      const u = (i / SAMPLE_RATE_HZ - onset - 0.1) / 0.8;
      frequencyHz[i] -= 0.6 * Math.sin(Math.PI * u) ** 2;
    }
  }
  // Numerical Recipes' LCG constants (from memory), scaled to −1..1.
  let state = kind === 'task' ? 5 : 9;
  const noise = () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 31 - 1;
  };
  const signals = ['O1', 'O2', 'Oz', 'Pz'].map((label, channel) => {
    const samples = new Float32Array(n);
    let phase = channel * 0.7;
    for (let i = 0; i < n; i++) {
      samples[i] = 20 * Math.sin(phase) + 3 * noise();
      phase += (2 * Math.PI * frequencyHz[i]) / SAMPLE_RATE_HZ;
    }
    return { label, sampleRateHz: SAMPLE_RATE_HZ, physicalMin: -500, physicalMax: 500, samples };
  });
  return edfWriter().writeEdf({
    format: 'EDF+C',
    startDate: '2025-04-07T09:30:00',
    signals,
    annotations: onsetsS.map((onsetS) => ({ onsetS, durationS: null, text: 'stimulus' })),
  });
}

// Generated test accounts of an invented study.
const ADMIN = { email: 'ida.admin@gyre.test', name: 'Ida Admin', password: E2E_PASSWORD };
const TECHNICIAN = { email: 'tor.tech@gyre.test', name: 'Tor Tech' };
const ANALYST = { email: 'anja.analyst@gyre.test', name: 'Anja Analyst' };
const COORDINATOR = { email: 'cai.coordinator@gyre.test', name: 'Cai Coordinator' };
const MEANING = 'reviewed and approved for the study record';

describe('Report sign-off in Chromium, on a real server', () => {
  let gyre: RunningGyre;
  let browser: Awaited<ReturnType<typeof openBrowser>>;
  let visit: VisitView;
  let analystToken: string;

  async function upload(token: string, kind: RecordingKind, bytes: Uint8Array) {
    const form = new FormData();
    form.append('kind', kind);
    form.append('file', new Blob([new Uint8Array(bytes)]), `${kind}.edf`);
    const response = await fetch(`${gyre.baseUrl}/api/visits/${visit.id}/recordings`, {
      method: 'POST',
      headers: { authorization: `Bearer ${token}` },
      body: form,
    });
    const text = await response.text();
    if (!response.ok) throw new Error(`upload answered ${response.status}: ${text}`);
    const recording = JSON.parse(text) as RecordingDto;
    const deadline = Date.now() + 240_000;
    for (;;) {
      const now = await api<RecordingDto>(
        gyre.baseUrl,
        token,
        'GET',
        `/api/recordings/${recording.id}`,
      );
      if (now.state === 'ready') return;
      if (now.state === 'rejected' || now.state === 'failed' || Date.now() > deadline) {
        throw new Error(`${kind} recording ${now.state}: ${JSON.stringify(now)}`);
      }
      await new Promise((wait) => setTimeout(wait, 500));
    }
  }

  const signIn = (page: Page, email: string, next: string) =>
    signInThroughPage(page, gyre.baseUrl, email, next);

  beforeAll(async () => {
    gyre = await startGyre();
    browser = await openBrowser();
    await createFirstAdmin(gyre.dataDir, ADMIN);
    const adminToken = await signInApi(gyre.baseUrl, ADMIN.email, ADMIN.password);
    const study = await api<StudyView>(gyre.baseUrl, adminToken, 'POST', '/api/studies', {
      code: 'ALPHA-SIGN',
      name: 'Alpha sign-off (invented)',
    });
    const site = await api<SiteView>(gyre.baseUrl, adminToken, 'POST', '/api/sites', {
      studyId: study.id,
      code: 'WEST',
      name: 'West clinic',
    });
    for (const [person, role] of [
      [TECHNICIAN, 'technician'],
      [COORDINATOR, 'coordinator'],
    ] as const) {
      await inviteAndAccept(gyre.baseUrl, gyre.dataDir, adminToken, {
        ...person,
        role,
        studyId: study.id,
        siteId: site.id,
      });
    }
    await inviteAndAccept(gyre.baseUrl, gyre.dataDir, adminToken, {
      ...ANALYST,
      role: 'analyst',
      studyId: study.id,
    });
    const techToken = await signInApi(gyre.baseUrl, TECHNICIAN.email, E2E_PASSWORD);
    analystToken = await signInApi(gyre.baseUrl, ANALYST.email, E2E_PASSWORD);
    const participant = await api<ParticipantView>(
      gyre.baseUrl,
      techToken,
      'POST',
      '/api/participants',
      {
        code: 'WC-0011',
      },
    );
    visit = await api<VisitView>(gyre.baseUrl, techToken, 'POST', '/api/visits', {
      participantId: participant.id,
      label: 'Baseline',
      visitDate: '2025-04-07',
    });
    await upload(techToken, 'resting', writeRecording('resting', 40));
    await upload(techToken, 'task', writeRecording('task', 40));
  }, 600_000);

  afterAll(async () => {
    await browser?.close();
    await gyre?.stop();
  });

  it('an analyst previews the draft PDF in the dialog, confirms the meaning, re-enters the password and signs', async () => {
    const page = await browser.context.newPage();
    const problems = watchConsole(page);
    await signIn(page, ANALYST.email, `/review/${visit.id}`);
    const panel = page.locator('[aria-label="Report"]');
    await panel.getByRole('button', { name: 'Preview and sign revision 1' }).click();
    const dialog = page.getByRole('dialog', { name: 'Preview and sign revision 1' });
    await dialog.getByTitle('Draft report preview').waitFor();
    // The frame holds the PDF itself (the browser's viewer), not a page refused by the CSP.
    await expect
      .poll(
        async () => {
          const frame = page.frames().find((f) => f.url().startsWith('blob:'));
          return frame === undefined ? null : frame.evaluate(() => document.contentType);
        },
        { timeout: 30_000, interval: 250 },
      )
      .toBe('application/pdf');
    await screenshot(page, 'signoff-preview');
    await dialog.getByRole('checkbox', { name: `I confirm: ${MEANING}.` }).check();
    await dialog.getByLabel('Your password, entered again').fill(E2E_PASSWORD);
    await dialog.getByRole('button', { name: 'Sign revision 1' }).click();
    await page.getByText('Signed: revision 1.', { exact: false }).waitFor();
    await panel.getByRole('button', { name: 'Download revision 1' }).waitFor();
    await screenshot(page, 'signoff-signed');
    const status = await api<ReportSignOffDto>(
      gyre.baseUrl,
      analystToken,
      'GET',
      `/api/visits/${visit.id}/report/sign-off`,
    );
    expect(status.revisions.map((r) => [r.revision, r.signerName, r.meaning])).toEqual([
      [1, ANALYST.name, MEANING],
    ]);
    expect(problems.filter((p) => /Content Security Policy|pageerror/.test(p))).toEqual([]);
    await page.close();
  });

  it('the coordinator follows the e-mailed link and downloads the signed PDF, byte for byte', async () => {
    const mail = await waitForMail(
      join(gyre.dataDir, 'mail'),
      { to: COORDINATOR.email, subject: /signed/ },
      30_000,
    );
    const link = /https?:\/\/\S+\/reports\/revisions\?revision=[\w-]+/.exec(mail.text)?.[0];
    expect(link).toBeDefined();
    const next = new URL(link ?? '').pathname + new URL(link ?? '').search;
    const page = await browser.context.newPage();
    await signIn(page, COORDINATOR.email, next);
    const sent = page.getByRole('region', { name: 'The report you were sent' });
    await sent.getByText('WC-0011, Baseline').waitFor();
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      sent.getByRole('button', { name: /^Download PDF: WC-0011 Baseline revision 1$/ }).click(),
    ]);
    const saved = await download.path();
    const bytes = readFileSync(saved);
    const coordinatorToken = await signInApi(gyre.baseUrl, COORDINATOR.email, E2E_PASSWORD);
    const revisions = await api<ListPage<ReportRevisionDto>>(
      gyre.baseUrl,
      coordinatorToken,
      'GET',
      '/api/report-revisions',
    );
    expect(revisions.items).toHaveLength(1);
    expect(download.suggestedFilename()).toBe('gyre-report-WC-0011-Baseline-r1.pdf');
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(revisions.items[0].pdfSha256);
    await screenshot(page, 'signoff-coordinator');
    await page.close();
  });
});
