import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import type {
  ParticipantView,
  RecordingView,
  RecordingResultsView,
  TrajectoryView,
  VisitFlagView,
  VisitView,
} from '@gyre/shared';
import { randomUUID } from 'node:crypto';
import { api, E2E_PASSWORD } from './support/accounts';
import { addParticipant, addVisit, setUpStudy, uploadComputed } from './support/study-data';
import { signInThroughPage } from './support/sign-in-page';
import { screenshot, watchConsole, openFromMainMenu } from './support/browser';
import { gyreInChromium } from './support/gyre-server';
import { RESEARCH_CAUTION } from './support/caution';
import { expectFitsWindow } from './support/page-width';

// Generated test accounts of an invented study.
const ADMIN = { email: 'rae.admin@gyre.test', name: 'Rae Admin', password: E2E_PASSWORD };
const TECHNICIAN = { email: 'theo.tech@gyre.test', name: 'Theo Tech' };
const ANALYST = { email: 'ava.analyst@gyre.test', name: 'Ava Analyst' };
const MONITOR = { email: 'milo.monitor@gyre.test', name: 'Milo Monitor' };
const FLAG_REASON = 'Alpha slows after onset over the ROI; the interval excludes zero';

/** Hz as the screens write it (shared/src/number-format.ts): U+2212 minus, no-break space. */
const formatHz = (value: number | null) =>
  value === null
    ? '—'
    : `${value < 0 && Math.abs(value) >= 0.005 ? '\u2212' : ''}${Math.abs(value).toFixed(2)}\u00a0Hz`;

/** The invented study this file's tests run on (support/study-data.ts builds it). */
const INVENTED_STUDY = {
  admin: ADMIN,
  study: { code: 'ALPHA-REVIEW', name: 'Alpha review (invented)' },
  members: { technician: TECHNICIAN, analyst: ANALYST, monitor: MONITOR },
};

describe('Review and Participants in Chromium, on a real server', () => {
  const run = gyreInChromium((gyre) => setUpStudy(gyre, INVENTED_STUDY));
  let analystToken: string;
  let participant: ParticipantView;
  const visits: VisitView[] = [];
  const recordings: Record<string, RecordingView> = {};

  const signIn = (page: Page, email: string, next: string) =>
    signInThroughPage(page, run.gyre.baseUrl, email, next);

  /** The results API's answer for one generated recording (`V1-task`, `V1-resting`, …). */
  const resultsOf = (key: string) =>
    api<RecordingResultsView>(
      run.gyre.baseUrl,
      analystToken,
      'GET',
      `/api/recordings/${recordings[key].id}/results`,
    );

  /** Pixels of a canvas that are drawn on (alpha > 0), read back from the page. */
  async function drawnPixels(page: Page, figure: string): Promise<number> {
    return page.getByRole('figure', { name: figure }).evaluate((element) => {
      let drawn = 0;
      for (const canvas of element.querySelectorAll('canvas')) {
        const context = canvas.getContext('2d');
        if (context === null || canvas.width === 0 || canvas.height === 0) continue;
        const { data } = context.getImageData(0, 0, canvas.width, canvas.height);
        for (let i = 3; i < data.length; i += 4) if (data[i] > 0) drawn += 1;
      }
      return drawn;
    });
  }

  async function expectDrawn(page: Page, figure: string, atLeast: number): Promise<void> {
    await page.getByRole('figure', { name: figure }).locator('canvas').first().waitFor();
    await expect
      .poll(() => drawnPixels(page, figure), { timeout: 30_000, interval: 500 })
      .toBeGreaterThan(atLeast);
  }

  beforeAll(async () => {
    const techToken = run.prepared.tokenOf('technician');
    analystToken = run.prepared.tokenOf('analyst');
    participant = await addParticipant(run.gyre, techToken, { code: 'EC-0007' });
    // Two visits a year apart; at the second the alpha rhythm runs slower and slows more.
    for (const [label, visitDate, alphaHz, deltaFHz] of [
      ['V1', '2024-03-04', 10.2, -0.5],
      ['V2', '2025-03-10', 9.9, -0.7],
    ] as const) {
      const visit = await addVisit(run.gyre, techToken, participant, { label, visitDate });
      visits.push(visit);
      const alpha = { alphaHz, startDate: `${visitDate}T09:30:00` } as const;
      recordings[`${label}-resting`] = await uploadComputed(run.gyre, techToken, visit, {
        ...alpha,
        kind: 'resting',
        deltaFHz: 0,
        durationS: 60,
      });
      recordings[`${label}-task`] = await uploadComputed(run.gyre, techToken, visit, {
        ...alpha,
        kind: 'task',
        deltaFHz,
        durationS: 120,
      });
    }
  }, 600_000);

  it('an analyst reviews a visit: every chart drawn, the numbers those of the API, and raises a flag', async () => {
    const visit = visits[0];
    const task = await resultsOf('V1-task');
    const rest = await resultsOf('V1-resting');
    expect(task.task).not.toBeNull();
    expect(rest.rest).not.toBeNull();

    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    await signIn(page, ANALYST.email, `/review/${visit.id}`);
    await page.getByText(`Review · ${participant.code} · ${visit.label}`).waitFor();
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);

    await expectDrawn(page, 'Onset curve', 5000);
    await expectDrawn(page, 'Trial raster', 5000);
    await expectDrawn(page, 'Rest spectrum', 3000);
    // Δf, PAF and CoG on screen, as the API computed them, to two decimals with the unit.
    await expect(page.getByTestId('roi-delta-f').innerText()).resolves.toBe(
      formatHz(task.run.roiDeltaFHz),
    );
    await expect(page.getByTestId('rest-paf').innerText()).resolves.toBe(
      `PAF ${rest.run.pafHz === null ? 'no clear peak' : formatHz(rest.run.pafHz)}`,
    );
    await expect(page.getByTestId('rest-cog').innerText()).resolves.toContain(
      formatHz(rest.run.cogHz),
    );
    // The generated task slows by 0.5 Hz for part of the post window: Δf must be negative.
    expect(task.run.roiDeltaFHz).toBeLessThan(0);
    await expect(page.getByTestId('settings-version-task').innerText()).resolves.toBe(
      `version ${task.run.settingsVersion}`,
    );
    const firstChannel = [...task.channels].sort(
      (a, b) => (a.deltaFHz ?? 0) - (b.deltaFHz ?? 0),
    )[0];
    const table = page.getByRole('table', { name: 'Per-channel task results' });
    await expect(table.getByRole('row').nth(1).innerText()).resolves.toContain(
      formatHz(firstChannel.deltaFHz),
    );
    await screenshot(page, 'review-analyst');

    // The flag form refuses a short reason, then raises the flag with a proper one.
    await page.getByLabel('Why raise it?').fill('too short');
    await page.getByRole('button', { name: 'Raise a slowing flag' }).click();
    await page.getByText('Write at least 10 characters (9 so far).').waitFor();
    await page.getByLabel('Why raise it?').fill(FLAG_REASON);
    await page.getByRole('button', { name: 'Raise a slowing flag' }).click();
    const decision = page.getByRole('region', { name: "Analyst's decision" });
    await decision.getByText('Slowing flag raised').waitFor();
    await expect(decision.innerText()).resolves.toContain(FLAG_REASON);
    const flag = await api<VisitFlagView>(
      run.gyre.baseUrl,
      analystToken,
      'GET',
      `/api/visits/${visit.id}/flag`,
    );
    expect(flag.current?.state).toBe('raised');
    expect(flag.current?.raiseReason).toBe(FLAG_REASON);
    await screenshot(page, 'review-analyst-flagged');

    // A new study settings version (post window to +0.9 s) is saved on its own screen and
    // re-runs nothing; Review then says what the new version would change, and re-runs on request.
    await openFromMainMenu(page, 'Study settings');
    const settings = page.getByRole('form', { name: 'Analysis settings' });
    await settings.getByLabel('Post end').fill('0.9');
    await settings.getByLabel('Reason for the change').fill('Longer post window after the pilot');
    await settings.getByRole('button', { name: 'Save version 2' }).click();
    await page.getByText('version 2', { exact: false }).first().waitFor();
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await screenshot(page, 'study-settings-analyst');
    // Saving the same values again is refused in words.
    await settings.getByLabel('Reason for the change').fill('Saving the same values once more');
    const before = problems.length;
    await settings.getByRole('button', { name: 'Save version 3' }).click();
    await page.getByText('Nothing changed', { exact: false }).first().waitFor();
    // The refusal is a 409 answer, which Chromium logs as a failed load; nothing else may.
    expect(problems.slice(before)).toEqual([
      'error: Failed to load resource: the server responded with a status of 409 (Conflict)',
    ]);
    problems.length = before;
    const unchanged = await resultsOf('V1-task');
    expect(unchanged.run.settingsVersion).toBe(1);
    expect(unchanged.run.staleSettings).toEqual(['post window 0.2–0.8 s → 0.2–0.9 s']);

    await page.goto(`${run.gyre.baseUrl}/review/${visit.id}`);
    const stale = page.getByLabel('Computed with older settings').first();
    await stale.getByText('post window 0.2–0.8 s → 0.2–0.9 s', { exact: false }).waitFor();
    await stale.getByRole('button', { name: 'Re-run with the current settings' }).click();
    await page
      .getByTestId('settings-version-task')
      .getByText('version 2')
      .waitFor({ timeout: 240_000 });
    const rerun = await resultsOf('V1-task');
    expect(rerun.run.settingsVersion).toBe(2);
    expect(rerun.task?.postWindowS).toEqual([0.2, 0.9]);
    await expect(page.getByTestId('roi-delta-f').innerText()).resolves.toBe(
      formatHz(rerun.run.roiDeltaFHz),
    );
    // The computation's suggestion follows the new run.
    await page
      .getByRole('region', { name: "Computation's suggestion" })
      .getByText(`ROI Δf ${formatHz(rerun.run.roiDeltaFHz)}`, { exact: false })
      .waitFor();
    await expectDrawn(page, 'Onset curve', 5000);
    await screenshot(page, 'review-analyst-rerun');

    // Participants: the list, then this participant's trajectory with the flagged visit.
    await openFromMainMenu(page, 'Participants');
    await page.getByRole('link', { name: participant.code }).waitFor();
    await screenshot(page, 'participants-analyst');
    await page.getByRole('link', { name: participant.code }).click();
    await page.getByText(`Participant ${participant.code}`).waitFor();
    await expectDrawn(page, 'Alpha frequency trajectory', 3000);
    await expectDrawn(page, 'Onset change trajectory', 3000);
    const trajectory = await api<TrajectoryView>(
      run.gyre.baseUrl,
      analystToken,
      'GET',
      `/api/participants/${participant.id}/trajectory`,
    );
    const visitsTable = page.getByRole('table', { name: 'Visits' });
    await expect(visitsTable.getByRole('row').nth(1).innerText()).resolves.toContain(
      formatHz(trajectory.visits[0].pafHz),
    );
    await expect(visitsTable.getByRole('row').nth(1).innerText()).resolves.toContain('flagged');
    await screenshot(page, 'participant-trajectory-analyst');
    await page.getByRole('link', { name: 'Review V2' }).click();
    await page.getByText(`Review · ${participant.code} · V2`).waitFor();
    expect(problems).toEqual([]);
    await page.close();
  });

  it('a monitor sees the same screens read-only', async () => {
    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    await signIn(page, MONITOR.email, `/review/${visits[0].id}`);
    await page.getByText(`Review · ${participant.code} · V1`).waitFor();
    await expectDrawn(page, 'Onset curve', 5000);
    await expectDrawn(page, 'Trial raster', 5000);
    await page
      .getByRole('region', { name: "Analyst's decision" })
      .getByText('Slowing flag raised')
      .waitFor();
    // A monitor may read the study's users: the decision names the analyst who made it.
    await page
      .getByRole('region', { name: "Analyst's decision" })
      .getByText(`by ${ANALYST.name}`, { exact: false })
      .waitFor();
    await expect(page.getByRole('button', { name: 'Raise a slowing flag' }).count()).resolves.toBe(
      0,
    );
    await expect(page.getByRole('button', { name: 'Clear the flag' }).count()).resolves.toBe(0);
    await expect(page.getByRole('form', { name: 'Analysis settings' }).count()).resolves.toBe(0);
    await expect(page.locator('textarea').count()).resolves.toBe(0);
    await screenshot(page, 'review-monitor');
    await openFromMainMenu(page, 'Participants');
    await page.getByRole('link', { name: participant.code }).waitFor();
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await screenshot(page, 'participants-monitor');
    // Keyboard only: Tab to the participant's link and open it with Enter.
    let focused = '';
    for (let presses = 0; presses < 40 && focused !== participant.code; presses++) {
      await page.keyboard.press('Tab');
      focused = await page.evaluate(() => document.activeElement?.textContent ?? '');
    }
    expect(focused).toBe(participant.code);
    await page.keyboard.press('Enter');
    await expectDrawn(page, 'Alpha frequency trajectory', 3000);
    await screenshot(page, 'participant-trajectory-monitor');
    expect(problems).toEqual([]);
    await page.close();
  });
  it('lists visits, latest values, flags and report per participant; Review fits a phone and a missing visit says so', async () => {
    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    // Same spaces and minus as the screen: the formatter writes U+2212 and a no-break space.
    const plain = (text: string) => text.replace(/\s/g, ' ').replace(/\u2212/g, '-');
    const trajectory = await api<TrajectoryView>(
      run.gyre.baseUrl,
      analystToken,
      'GET',
      `/api/participants/${participant.id}/trajectory`,
    );
    const v2 = trajectory.visits.find((v) => v.label === 'V2');
    expect(v2?.pafHz).not.toBeNull();
    expect(v2?.deltaFHz).not.toBeNull();

    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, ANALYST.email, '/participants');
    const row = page.getByRole('row').filter({ hasText: participant.code });
    await row.waitFor();
    const cells = (await row.getByRole('cell').allInnerTexts()).map(plain);
    // Site by its full name; 2 visits; V2's PAF and Δf as the trajectory API gives them;
    // the flag raised on V1 in the first test; V2's report drafted, never signed.
    expect(cells.slice(0, 4)).toEqual([participant.code, 'East clinic', '—', '2']);
    expect(cells[4]).toBe(plain(`${formatHz(v2!.pafHz)} (V2)`));
    expect(cells[5]).toBe(plain(`${v2!.deltaFHz! >= 0 ? '+' : ''}${formatHz(v2!.deltaFHz)} (V2)`));
    expect(cells[6]).toBe('1 open');
    expect(cells[7]).toBe('V2: Draft, not signed');
    await expect(
      page.getByLabel('Search participant codes').getAttribute('placeholder'),
    ).resolves.toBe(`Search by code, e.g. ${participant.code}`);
    // The site filter from the keyboard: Tab from the search, open with the arrow, Enter.
    await page.getByLabel('Search participant codes').focus();
    await page.keyboard.press('Tab');
    await page.keyboard.press('Tab');
    await expect(
      page.evaluate(() => document.activeElement?.getAttribute('aria-label')),
    ).resolves.toBe('Site');
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('Enter');
    await page.waitForURL(/[?&]site=/);
    await row.waitFor();
    await screenshot(page, 'participants-columns-1440');

    await page.setViewportSize({ width: 390, height: 844 });
    await row.waitFor();
    await expectFitsWindow(page, 'Participants at 390 px');
    await screenshot(page, 'participants-columns-390');

    // Review at phone width: nothing sideways, and the chip and the card name one state.
    await page.goto(`${run.gyre.baseUrl}/review/${visits[1].id}`);
    const chip = page.getByTestId('report-state-chip');
    const card = page.getByTestId('report-state-card');
    await chip.waitFor();
    await card.waitFor();
    await expectDrawn(page, 'Onset curve', 2000);
    const chipText = await chip.innerText();
    const cardText = await card.innerText();
    expect(chipText).toBe(`Report: ${cardText}`);
    expect(cardText).toBe('Draft, not signed yet');
    await expectFitsWindow(page, 'Review at 390 px');
    // Card titles wrap instead of being cut.
    const cut = await page.evaluate(() =>
      [...document.querySelectorAll('.ant-card-head-title')]
        .filter((title) => title.scrollWidth > title.clientWidth + 1)
        .map((title) => title.textContent),
    );
    expect(cut).toEqual([]);
    await screenshot(page, 'review-390');
    await page.setViewportSize({ width: 1440, height: 900 });
    await chip.waitFor();
    await screenshot(page, 'review-1440');

    // A visit that does not exist: said in words, a way back, nothing to try again.
    await page.goto(`${run.gyre.baseUrl}/review/${randomUUID()}`);
    await page.getByText('This visit does not exist or you cannot open it').waitFor();
    await expect(page.getByRole('button', { name: 'Try again' }).count()).resolves.toBe(0);
    await page.getByRole('link', { name: 'Back to the start' }).waitFor();
    await screenshot(page, 'review-missing-visit');
    // The 404 is Chromium's failed load of the visit; nothing else may be logged.
    expect(problems.filter((p) => !p.includes('404'))).toEqual([]);
    await page.close();
  });
});
