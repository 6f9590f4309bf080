import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import {
  SIGNATURE_MEANING,
  type ReportSignOffView,
  type SiteView,
  type StudyView,
} from '@gyre/shared';
import {
  api,
  createFirstAdmin,
  E2E_PASSWORD,
  invitationToken,
  inviteAndAccept,
  resetToken,
  signInApi,
} from './support/accounts';
import { openBrowser, screenshot, watchConsole, openFromMainMenu } from './support/browser';
import { writeRestingEdf, writeTruncatedEdf } from './support/edf-files';
import { startGyre, type RunningGyre } from './support/gyre-server';
import { RESEARCH_CAUTION } from './support/caution';
import { expectFitsWindow } from './support/page-width';

// Generated test accounts of an invented study.
const ADMIN = { email: 'ada.admin@gyre.test', name: 'Ada Admin', password: E2E_PASSWORD };
const PEOPLE = {
  technician: { email: 'tess.tech@gyre.test', name: 'Tess Tech' },
  analyst: { email: 'alan.analyst@gyre.test', name: 'Alan Analyst' },
  monitor: { email: 'mira.monitor@gyre.test', name: 'Mira Monitor' },
  coordinator: { email: 'cole.coord@gyre.test', name: 'Cole Coordinator' },
} as const;
const FLAG_REASON = 'Alpha slows by about 0.4 Hz after onset in the ROI; checked by eye';

describe('every screen of this part in Chromium, on a real server', () => {
  let gyre: RunningGyre;
  const browsers: Awaited<ReturnType<typeof openBrowser>>[] = [];
  let files: string;
  let adminToken: string;
  let study: StudyView;
  let site: SiteView;
  let visitId = '';

  /**
   * A page in a browser of its own: each person has their own refresh cookie and storage, as
   * on their own machine (one profile would share one cookie among everyone signing in).
   */
  async function newPage(): Promise<{ page: Page; problems: string[] }> {
    const browser = await openBrowser();
    browsers.push(browser);
    const page = await browser.context.newPage();
    return { page, problems: watchConsole(page) };
  }

  async function closeBrowsers(): Promise<void> {
    for (const browser of browsers.splice(0)) await browser.close();
  }

  async function signIn(page: Page, email: string, password = E2E_PASSWORD): Promise<void> {
    await page.goto(`${gyre.baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill(password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText(/^Welcome, /).waitFor();
  }

  /** The menu's entries among this part's screens (other parts may add their own). */
  async function menu(page: Page): Promise<string[]> {
    const screens = ['Intake', 'Participants', 'Ledger', 'Reports', 'Team', 'Outbox'];
    const labels = await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('menuitem')
      .allInnerTexts();
    return labels.filter((label) => screens.includes(label));
  }

  /** Each person's main menu among this part's screens, as the start screen shows it. */
  const HOME_MENU: Record<keyof typeof PEOPLE | 'admin', string[]> = {
    admin: ['Ledger', 'Team', 'Outbox'],
    technician: ['Intake'],
    analyst: ['Participants'],
    monitor: ['Participants', 'Ledger'],
    coordinator: ['Reports'],
  };

  /** A new page signed in as `who`, on a start screen with their menu (shot as `home-<who>`). */
  async function signedInHome(who: keyof typeof HOME_MENU) {
    const { page, problems } = await newPage();
    await signIn(page, who === 'admin' ? ADMIN.email : PEOPLE[who].email);
    expect(await menu(page)).toEqual(HOME_MENU[who]);
    await screenshot(page, `home-${who}`);
    return { page, problems };
  }

  beforeAll(async () => {
    files = mkdtempSync(join(tmpdir(), 'gyre-e2e-files-'));
    gyre = await startGyre();
    await createFirstAdmin(gyre.dataDir, ADMIN);
    adminToken = await signInApi(gyre.baseUrl, ADMIN.email, ADMIN.password);
    study = await api<StudyView>(gyre.baseUrl, adminToken, 'POST', '/api/studies', {
      code: 'ALPHA-AGE',
      name: 'Alpha in ageing (invented)',
    });
    site = await api<SiteView>(gyre.baseUrl, adminToken, 'POST', '/api/sites', {
      studyId: study.id,
      code: 'NORTH',
      name: 'North clinic',
    });
    for (const role of ['analyst', 'monitor', 'coordinator'] as const) {
      await inviteAndAccept(gyre.baseUrl, gyre.dataDir, adminToken, {
        ...PEOPLE[role],
        role,
        studyId: study.id,
        ...(role === 'coordinator' ? { siteId: site.id } : {}),
      });
    }
  });

  afterEach(async () => {
    await closeBrowsers();
  });

  afterAll(async () => {
    await closeBrowsers();
    await gyre?.stop();
    if (files) rmSync(files, { recursive: true, force: true });
  });

  it('an admin invites a technician on Team, who accepts from the e-mailed link', async () => {
    const { page, problems } = await signedInHome('admin');
    await openFromMainMenu(page, 'Team');
    await page.getByText(PEOPLE.monitor.email).waitFor();
    await page.getByRole('button', { name: 'Invite someone' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('E-mail').fill(PEOPLE.technician.email);
    await dialog.getByLabel('Name').fill(PEOPLE.technician.name);
    await dialog.getByLabel('Role').click();
    await page.getByTitle('Technician', { exact: true }).click();
    await dialog.getByLabel('Study').click();
    await page.getByTitle('ALPHA-AGE · Alpha in ageing (invented)').click();
    await dialog.getByLabel('Site').click();
    await page.getByTitle('NORTH · North clinic').click();
    await screenshot(page, 'team-admin-invite');
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await page
      .getByText(`${PEOPLE.technician.email} is invited; the e-mail is on its way.`)
      .waitFor();
    await page
      .getByRole('row', { name: new RegExp(PEOPLE.technician.email) })
      .getByText('Invited')
      .waitFor();
    await dialog.waitFor({ state: 'hidden' });
    await screenshot(page, 'team-admin');
    await page.getByRole('link', { name: 'Outbox' }).click();
    await page.getByText('You are invited to Gyre').first().waitFor();
    await screenshot(page, 'outbox-admin');
    await page.getByRole('link', { name: 'Ledger' }).click();
    await page.getByText('The trail is intact').waitFor();
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await screenshot(page, 'ledger-admin');

    // The technician opens the link from the fake SMTP server's copy of the message.
    const token = await invitationToken(gyre.dataDir, PEOPLE.technician.email);
    const { page: invited, problems: invitedProblems } = await newPage();
    await invited.goto(`${gyre.baseUrl}/accept-invite?token=${encodeURIComponent(token)}`, {
      waitUntil: 'networkidle',
    });
    await invited.getByLabel('New password').fill('too short');
    await invited.getByLabel('Repeat the password').fill('too short');
    await invited.getByRole('button', { name: 'Create my account' }).click();
    await invited.getByText('The password has 9 characters; at least 12 are needed.').waitFor();
    await screenshot(invited, 'accept-invite-validation');
    await invited.getByLabel('New password').fill(E2E_PASSWORD);
    await invited.getByLabel('Repeat the password').fill(E2E_PASSWORD);
    await invited.getByRole('button', { name: 'Create my account' }).click();
    await invited
      .getByText('Your account is ready. Sign in with your e-mail and new password.')
      .waitFor();
    await invited.close();
    expect(problems).toEqual([]);
    expect(invitedProblems).toEqual([]);
  });

  it('a technician uploads an EDF+ file and sees it reach ready; a bad file is refused in plain words', async () => {
    const { page, problems } = await signedInHome('technician');
    await openFromMainMenu(page, 'Intake');
    await page.getByRole('button', { name: 'Register a new participant' }).click();
    let dialog = page.getByRole('dialog');
    await dialog.getByLabel('Participant code').fill('ana lopez');
    await dialog.getByRole('button', { name: 'Register participant' }).click();
    await dialog.getByText(/A code is 3–24 capital letters/).waitFor();
    await dialog.getByLabel('Participant code').fill('ac-0042');
    await dialog.getByLabel('Enrolment date').click();
    await dialog.getByLabel('Enrolment date').fill('3 Feb 2025');
    await dialog.getByLabel('Enrolment date').press('Enter');
    await dialog.getByRole('button', { name: 'Register participant' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByRole('button', { name: 'Register a new visit' }).click();
    dialog = page.getByRole('dialog');
    await dialog.getByLabel('Visit label').fill('V1');
    await dialog.getByLabel('Visit date').click();
    await dialog.getByLabel('Visit date').fill('3 Feb 2025');
    await dialog.getByLabel('Visit date').press('Enter');
    await dialog.getByRole('button', { name: 'Register visit' }).click();
    await page.getByText('Upload recordings for AC-0042, V1').waitFor();
    visitId = new URL(page.url()).searchParams.get('visit') ?? '';
    expect(visitId).not.toBe('');

    // A broken file first (refused in plain words), then the good one: once a visit has its
    // resting recording, a second resting file is an explicit replacement, not an upload.
    // The visit's own drop zone (Intake also has a bulk-upload input for many files).
    const dropzoneInput = page.locator('input[type=file][aria-label^="Drop "]');
    const table = page.locator('.ant-card', { hasText: 'Recordings of this visit' });
    await dropzoneInput.setInputFiles(writeTruncatedEdf(files));
    const refused = page.getByRole('list', { name: 'Uploads' }).getByRole('alert');
    await refused.waitFor({ timeout: 60_000 });
    const refusal = await refused.innerText();
    expect(refusal).toContain('Not accepted.');
    // The EDF spec ties the file size to the header's record count; the reader names the field.
    expect(refusal.toLowerCase()).toMatch(/record/);
    await table.locator('[data-state="rejected"]').waitFor();

    await dropzoneInput.setInputFiles(writeRestingEdf(files));
    await page.getByText('Received and checked.').waitFor({ timeout: 60_000 });
    await table.locator('[data-state="ready"]').waitFor({ timeout: 120_000 });
    await expect(
      table.getByText(/EDF\+C · 60\.0\ss · 6 channels · 256\.00\sHz/).count(),
    ).resolves.toBe(1);
    await screenshot(page, 'intake-technician');
    // The refusal itself is a 422 answer, which Chromium logs as a failed load; nothing else may.
    expect(problems).toEqual([
      'error: Failed to load resource: the server responded with a status of 422 (Unprocessable Entity)',
    ]);
    problems.length = 0;

    // The access token lives in memory only: after a reload the refresh cookie renews it.
    const intakeAddress = page.url().slice(gyre.baseUrl.length);
    await page.reload({ waitUntil: 'networkidle' });
    await page.getByText('Upload recordings for AC-0042, V1').waitFor();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByText('You are signed out.').first().waitFor();
    await page.goto(`${gyre.baseUrl}${intakeAddress}`, { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).searchParams.get('next')).toBe(intakeAddress);
    await screenshot(page, 'sign-in');
    await page.getByLabel('E-mail').fill(PEOPLE.technician.email);
    await page.getByLabel('Password', { exact: true }).fill(E2E_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${gyre.baseUrl}${intakeAddress}`);
    await page.locator('[data-state="ready"]').waitFor();
    expect(problems).toEqual([]);
  });

  it("the monitor finds the analyst's flag in the Ledger with its reason, and exports it", async () => {
    const analystToken = await signInApi(gyre.baseUrl, PEOPLE.analyst.email, E2E_PASSWORD);
    await api(gyre.baseUrl, analystToken, 'POST', `/api/visits/${visitId}/flag/raise`, {
      reason: FLAG_REASON,
    });
    const { page, problems } = await signedInHome('monitor');
    await openFromMainMenu(page, 'Ledger');
    await page.getByText('The trail is intact').waitFor();
    await page.getByLabel('Action').fill('raise');
    await page.getByTitle('raise', { exact: true }).click();
    await page.waitForURL(/action=raise/);
    // Only the one raise is left: sign-ins and the invitation acceptance are filtered out.
    await page.getByText('1 entry', { exact: true }).waitFor();
    // The entry reads as a sentence (its own test: e2e/ledger.e2e.ts).
    const row = page.getByRole('article').filter({ hasText: FLAG_REASON });
    await expect(row.innerText()).resolves.toContain(
      `${PEOPLE.analyst.name} raised a slowing flag on`,
    );
    await row.getByRole('button', { name: 'Details' }).click();
    const changes = page.getByRole('table', { name: /Changes in entry/ });
    await changes.getByText('Reason for raising').waitFor();
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await screenshot(page, 'ledger-monitor');

    const download = page.waitForEvent('download');
    await page.getByRole('button', { name: 'Export CSV' }).click();
    const saved = await download;
    const csv = readFileSync((await saved.path()) ?? '', 'utf8');
    expect(csv.split('\r\n')[0]).toContain('seq,at,actorId');
    expect(csv).toContain(FLAG_REASON);
    expect(csv).not.toContain('sign-in');
    await page.getByText('The CSV is downloaded. The export itself is now in the trail.').waitFor();
    expect(problems).toEqual([]);
  });

  it('a coordinator downloads the signed report from Reports and cannot open Review', async () => {
    // The analyst signs the visit's report through the API (the sign-off screen is elsewhere).
    const analystToken = await signInApi(gyre.baseUrl, PEOPLE.analyst.email, E2E_PASSWORD);
    const signOff = await api<ReportSignOffView>(
      gyre.baseUrl,
      analystToken,
      'GET',
      `/api/visits/${visitId}/report/sign-off`,
    );
    expect(signOff.cannotSignReason).toBeNull();
    await api(gyre.baseUrl, analystToken, 'POST', `/api/visits/${visitId}/report/sign`, {
      password: E2E_PASSWORD,
      meaning: SIGNATURE_MEANING,
      fingerprint: signOff.draftFingerprint,
    });
    const { page, problems } = await signedInHome('coordinator');
    await openFromMainMenu(page, 'Reports');
    const row = page.getByRole('row').filter({ hasText: 'AC-0042' });
    await row.getByText(/^(Signed|Sent)$/).waitFor();
    const download = page.waitForEvent('download');
    await row.getByRole('button', { name: 'Download the report of AC-0042-V1' }).click();
    const pdf = readFileSync((await (await download).path()) ?? '');
    // Every PDF file starts with its header "%PDF-" (ISO 32000-1, 7.5.2).
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await screenshot(page, 'reports-coordinator');
    await page.goto(`${gyre.baseUrl}/review/${visitId}`, { waitUntil: 'networkidle' });
    await page.getByText('Not available for your role').waitFor();
    await expect(
      page.getByText('Review is not part of the coordinator role').count(),
    ).resolves.toBe(1);
    await screenshot(page, 'review-coordinator-not-available');
    expect(problems).toEqual([]);
  });

  it('an analyst may open Reports by address, not the Ledger; unknown addresses say so', async () => {
    const { page, problems } = await signedInHome('analyst');
    await page.goto(`${gyre.baseUrl}/reports`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Reports' }).waitFor();
    await screenshot(page, 'reports-analyst');
    await page.goto(`${gyre.baseUrl}/ledger`, { waitUntil: 'networkidle' });
    await page.getByText('Not available for your role').waitFor();
    await screenshot(page, 'ledger-analyst-not-available');
    await page.goto(`${gyre.baseUrl}/no/such/screen`, { waitUntil: 'networkidle' });
    await page.getByText('No such page').waitFor();
    await screenshot(page, 'not-found');
    expect(problems).toEqual([]);
  });

  it('resets a forgotten password through the e-mailed link', async () => {
    const { page, problems } = await newPage();
    await page.goto(`${gyre.baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    // The sign-in screen stays while the next screen's code loads, and it has an E-mail field
    // too: wait for the reset screen, or the address goes into the screen being left.
    await page.getByRole('button', { name: 'Send the link' }).waitFor();
    await page.getByLabel('E-mail').fill(PEOPLE.coordinator.email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await page.getByText('Check your e-mail').waitFor();
    await screenshot(page, 'forgot-password');
    const token = await resetToken(gyre.dataDir, PEOPLE.coordinator.email);
    await page.goto(`${gyre.baseUrl}/reset-password?token=${encodeURIComponent(token)}`, {
      waitUntil: 'networkidle',
    });
    await page.getByLabel('New password').fill('amber-harbour-lantern-7');
    await page.getByLabel('Repeat the password').fill('amber-harbour-lantern-7');
    await screenshot(page, 'reset-password');
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByText('Your password is changed. Sign in with the new one.').waitFor();
    await signIn(page, PEOPLE.coordinator.email, 'amber-harbour-lantern-7');
    expect(problems).toEqual([]);
  });

  const PHONE = { width: 390, height: 844 };

  it("the admin's Study set-up shows the visit schedule and takes a new planned visit", async () => {
    await api(gyre.baseUrl, adminToken, 'POST', `/api/studies/${study.id}/planned-visits`, {
      name: 'Baseline',
      targetDay: 0,
      windowBeforeDays: 0,
      windowAfterDays: 14,
      position: 0,
    });
    // A description long enough that it must wrap in the narrow groups column at 1280 px.
    const group = await api<{ name: string }>(
      gyre.baseUrl,
      adminToken,
      'POST',
      `/api/studies/${study.id}/groups`,
      {
        name: 'Evening practice',
        description:
          'Ten minutes of slow breathing each evening for eight weeks, logged in a diary that the site collects at every visit (invented).',
      },
    );
    const { page, problems } = await newPage();
    await signIn(page, ADMIN.email);
    await openFromMainMenu(page, 'Study set-up');
    // The only study may already be chosen; choosing it again changes nothing.
    await page.locator('#setup-study').click();
    await page
      .locator('.ant-select-item-option[title="ALPHA-AGE · Alpha in ageing (invented)"]')
      .click();
    const schedule = page.getByRole('region', { name: 'Visit schedule' });
    await schedule.getByRole('row', { name: /Baseline/ }).waitFor();
    await schedule.getByRole('button', { name: 'Add planned visit' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill('Month 6');
    await dialog.getByLabel('Target day after enrolment').fill('182');
    await dialog.getByLabel('Window before').fill('14');
    await dialog.getByLabel('Window after').fill('14');
    await dialog.getByRole('button', { name: 'Save planned visit' }).click();
    await dialog.waitFor({ state: 'hidden' });
    const month6 = schedule.getByRole('row', { name: /Month 6/ });
    await month6.waitFor();
    await expect(month6.innerText()).resolves.toContain('day 182');
    // The confirmation fades out on its own; the pictures show the screen without it.
    await page.getByText('Month 6 saved.').waitFor({ state: 'hidden' });
    const rows = await schedule.getByRole('row').allInnerTexts();
    // The header row, then the planned visits in schedule order.
    expect(rows).toHaveLength(3);
    expect(rows[1]).toMatch(/^Baseline\s+day 0\b/);
    expect(rows[2]).toMatch(/^Month 6\s+day 182\b/);
    // At 1280 px the groups sit in the narrow right column: the description wraps, the page
    // does not scroll sideways, and the row's actions stay in view.
    const groupRow = page
      .getByRole('region', { name: 'Groups' })
      .getByRole('row', { name: new RegExp(group.name) });
    await groupRow.waitFor();
    await expectFitsWindow(page, 'Study set-up at 1280 px');
    const change = await groupRow.getByRole('button', { name: 'Change' }).boundingBox();
    expect(change).not.toBeNull();
    expect(change!.x + change!.width).toBeLessThanOrEqual(1280);
    await screenshot(page, 'study-setup-admin');
    await page.setViewportSize(PHONE);
    await schedule.getByRole('row', { name: /Month 6/ }).waitFor();
    await expectFitsWindow(page, 'Study set-up at 390 px');
    await screenshot(page, 'study-setup-admin-phone');
    expect(problems).toEqual([]);
  });

  it('an analyst works from the worklist: opens Review from it, marks the visit reviewed, and it leaves the list', async () => {
    const { page, problems } = await newPage();
    await signIn(page, PEOPLE.analyst.email);
    const list = page.getByRole('region', { name: 'Worklist' });
    // Cards and badges are named by aria-label (a generic element has no role name to find).
    const unreviewed = list.locator('[aria-label="Results not reviewed"]');
    // One visit has results (the resting recording) and nobody has reviewed them.
    await unreviewed.locator('[aria-label="1 items"]').waitFor();
    await expect(list.locator('[aria-label="0 items"]').count()).resolves.toBe(4);
    const item = unreviewed.getByRole('listitem').filter({ hasText: 'AC-0042 · V1' });
    await expect(item.innerText()).resolves.toContain(
      'Results of the resting recording not reviewed yet',
    );
    // The visit was registered before the study had a schedule: unscheduled.
    await item.locator('[aria-label="Schedule: Unscheduled"]').waitFor();
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await screenshot(page, 'home-analyst-worklist');
    await page.setViewportSize(PHONE);
    await expectFitsWindow(page, 'Worklist at 390 px');
    await screenshot(page, 'home-analyst-worklist-phone');
    await page.setViewportSize({ width: 1280, height: 800 });

    await item.getByRole('link', { name: 'AC-0042 · V1' }).click();
    await page.waitForURL(`${gyre.baseUrl}/review/${visitId}`);
    await page.getByRole('heading', { name: 'Review · AC-0042 · V1' }).waitFor();
    await page.locator('[aria-label="Schedule: Unscheduled"]').waitFor();
    await page.getByText('No one has marked this visit reviewed yet.').waitFor();
    await page.getByRole('button', { name: 'Mark reviewed' }).click();
    await page.getByText('The visit is marked reviewed.').waitFor();
    await page.getByRole('button', { name: 'Mark reviewed' }).waitFor({ state: 'detached' });
    await screenshot(page, 'review-analyst-reviewed');
    // Opened at phone width (a chart keeps its old width for a moment after a resize).
    await page.setViewportSize(PHONE);
    await page.reload({ waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Review · AC-0042 · V1' }).waitFor();
    await page.getByText(/^Reviewed$/).waitFor();
    await expectFitsWindow(page, 'Review at 390 px');
    await screenshot(page, 'review-analyst-phone');
    await page.setViewportSize({ width: 1280, height: 800 });

    await page.goto(`${gyre.baseUrl}/`, { waitUntil: 'networkidle' });
    await list.locator('[aria-label="0 items"]').nth(4).waitFor();
    await expect(unreviewed.locator('[aria-label="0 items"]').count()).resolves.toBe(1);
    await expect(unreviewed.getByText('Nothing waits here.').count()).resolves.toBe(1);
    await page.getByText('Nothing is waiting.').waitFor();
    expect(problems).toEqual([]);
  });
  it('an analyst opens the Study overview: completion, site quality and the caution, at desktop and phone width', async () => {
    const { page, problems } = await newPage();
    await signIn(page, PEOPLE.analyst.email);
    await openFromMainMenu(page, 'Study overview');
    // antd puts a table's aria-label on its wrapper, so find it by the label itself.
    const matrix = page.locator('[aria-label="Completion matrix"]');
    await matrix.waitFor();
    // AC-0042 is the one participant; its visit is on no planned visit, so each planned
    // visit of the schedule (Baseline, Month 6) is still missing for it.
    const row = matrix.getByRole('row').filter({ hasText: 'AC-0042' });
    await expect(row.innerText()).resolves.toMatch(/missing/i);
    await page.locator('[aria-label="Site quality"]').waitFor();
    // The page's caution comes first; the exports card repeats it beside the downloads.
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).first().innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await screenshot(page, 'study-overview-analyst');
    await page.setViewportSize(PHONE);
    await page.reload({ waitUntil: 'networkidle' });
    await matrix.waitFor();
    await expectFitsWindow(page, 'Study overview at 390 px');
    await screenshot(page, 'study-overview-analyst-phone');
    expect(problems).toEqual([]);
  });
});
