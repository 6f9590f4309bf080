import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import type {
  Page as ListPage,
  ReportRevisionView,
  ReportSignOffView,
  VisitView,
} from '@gyre/shared';
import { waitForMail } from '../../backend/test/helpers/mail-catcher';
import { api, E2E_PASSWORD, signInApi } from './support/accounts';
import { addParticipant, addVisit, setUpStudy, uploadComputed } from './support/study-data';
import { signInThroughPage } from './support/sign-in-page';
import { screenshot, watchConsole } from './support/browser';
import { gyreInChromium } from './support/gyre-server';

// Generated test accounts of an invented study.
const ADMIN = { email: 'ida.admin@gyre.test', name: 'Ida Admin', password: E2E_PASSWORD };
const TECHNICIAN = { email: 'tor.tech@gyre.test', name: 'Tor Tech' };
const ANALYST = { email: 'anja.analyst@gyre.test', name: 'Anja Analyst' };
const COORDINATOR = { email: 'cai.coordinator@gyre.test', name: 'Cai Coordinator' };
const MEANING = 'reviewed and approved for the study record';

/** The invented study this file's tests run on (support/study-data.ts builds it). */
const INVENTED_STUDY = {
  admin: ADMIN,
  study: { code: 'ALPHA-SIGN', name: 'Alpha sign-off (invented)' },
  members: { technician: TECHNICIAN, coordinator: COORDINATOR, analyst: ANALYST },
};

describe('Report sign-off in Chromium, on a real server', () => {
  const run = gyreInChromium((gyre) => setUpStudy(gyre, INVENTED_STUDY));
  let visit: VisitView;
  let analystToken: string;

  const signIn = (page: Page, email: string, next: string) =>
    signInThroughPage(page, run.gyre.baseUrl, email, next);

  beforeAll(async () => {
    const techToken = run.prepared.tokenOf('technician');
    analystToken = run.prepared.tokenOf('analyst');
    const participant = await addParticipant(run.gyre, techToken, { code: 'WC-0011' });
    visit = await addVisit(run.gyre, techToken, participant, {
      label: 'Baseline',
      visitDate: '2025-04-07',
    });
    // 10 Hz alpha slowing by 0.6 Hz after a stimulus every 3 s (study-data.ts, generated).
    for (const kind of ['resting', 'task'] as const) {
      await uploadComputed(run.gyre, techToken, visit, {
        kind,
        alphaHz: 10,
        deltaFHz: -0.6,
        durationS: 40,
        startDate: '2025-04-07T09:30:00',
        channels: ['O1', 'O2', 'Oz', 'Pz'],
        firstOnsetS: 4,
        everyS: 3,
      });
    }
  }, 600_000);

  it('an analyst previews the draft PDF in the dialog, confirms the meaning, re-enters the password and signs', async () => {
    const page = await run.browser.context.newPage();
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
    const status = await api<ReportSignOffView>(
      run.gyre.baseUrl,
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
      join(run.gyre.dataDir, 'mail'),
      { to: COORDINATOR.email, subject: /signed/ },
      30_000,
    );
    const link = /https?:\/\/\S+\/reports\/revisions\?revision=[\w-]+/.exec(mail.text)?.[0];
    expect(link).toBeDefined();
    const next = new URL(link ?? '').pathname + new URL(link ?? '').search;
    const page = await run.browser.context.newPage();
    await signIn(page, COORDINATOR.email, next);
    const sent = page.getByRole('region', { name: 'The report you were sent' });
    await sent.getByText('WC-0011, Baseline').waitFor();
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      sent.getByRole('button', { name: /^Download PDF: WC-0011 Baseline revision 1$/ }).click(),
    ]);
    const saved = await download.path();
    const bytes = readFileSync(saved);
    const coordinatorToken = await signInApi(run.gyre.baseUrl, COORDINATOR.email, E2E_PASSWORD);
    const revisions = await api<ListPage<ReportRevisionView>>(
      run.gyre.baseUrl,
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
