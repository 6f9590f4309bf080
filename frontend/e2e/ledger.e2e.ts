import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import type { ParticipantView, SiteView, StudyView, VisitView } from '@gyre/shared';
import { api, E2E_PASSWORD } from './support/accounts';
import { screenshot, watchConsole } from './support/browser';
import { gyreInChromium } from './support/gyre-server';
import { expectFitsWindow } from './support/page-width';
import { signInThroughPage } from './support/sign-in-page';
import { addParticipant, addVisit, setUpStudy } from './support/study-data';

// Generated test accounts of an invented study.
const ADMIN = { email: 'lea.admin@gyre.test', name: 'Lea Admin', password: E2E_PASSWORD };
const TECHNICIAN = { email: 'teo.tech@gyre.test', name: 'Teo Tech' };
const ANALYST = { email: 'ana.analyst@gyre.test', name: 'Ana Analyst' };
const MONITOR = { email: 'mo.monitor@gyre.test', name: 'Mo Monitor' };
const OTHER_TECHNICIAN = { email: 'olga.tech@gyre.test', name: 'Olga Tech' };
const FLAG_REASON = 'ROI slowing in the task window of both sessions';
/** A zone with a non-zero offset, so a missing conversion would show. */
const ZONE = 'Europe/Berlin';

/** The invented study this file's tests run on (support/study-data.ts builds it). */
const INVENTED_STUDY = {
  admin: ADMIN,
  study: { code: 'ALPHA-LEDGER', name: 'Alpha ledger (invented)' },
  members: { technician: TECHNICIAN, analyst: ANALYST, monitor: MONITOR },
};

describe('The Ledger as a monitor reads it, in Chromium on a real server', () => {
  const run = gyreInChromium((gyre) => setUpStudy(gyre, INVENTED_STUDY));
  let flagged: ParticipantView;
  let flaggedVisit: VisitView;
  let other: ParticipantView;

  beforeAll(async () => {
    const techToken = run.prepared.tokenOf('technician');
    const newParticipant = async (code: string, label: string) => {
      const participant = await addParticipant(run.gyre, techToken, { code });
      const visit = await addVisit(run.gyre, techToken, participant, {
        label,
        visitDate: '2026-11-30',
      });
      return { participant, visit };
    };
    ({ participant: other } = await newParticipant('EC-0002', 'V1'));
    // Another study's set-up in between: entries a monitor of this study may not read.
    const otherStudy = await api<StudyView>(
      run.gyre.baseUrl,
      run.prepared.adminToken,
      'POST',
      '/api/studies',
      {
        code: 'BETA-LEDGER',
        name: 'Beta ledger (invented)',
      },
    );
    const otherSite = await api<SiteView>(
      run.gyre.baseUrl,
      run.prepared.adminToken,
      'POST',
      '/api/sites',
      {
        studyId: otherStudy.id,
        code: 'SOUTH',
        name: 'South clinic',
      },
    );
    await api(run.gyre.baseUrl, run.prepared.adminToken, 'POST', '/api/users/invitations', {
      ...OTHER_TECHNICIAN,
      role: 'technician',
      studyId: otherStudy.id,
      siteId: otherSite.id,
    });
    ({ participant: flagged, visit: flaggedVisit } = await newParticipant('EC-0001', 'V2'));
    const analystToken = run.prepared.tokenOf('analyst');
    await api(run.gyre.baseUrl, analystToken, 'POST', `/api/visits/${flaggedVisit.id}/flag/raise`, {
      reason: FLAG_REASON,
    });
  });

  async function monitorPage(): Promise<{ page: Page; problems: string[] }> {
    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    const cdp = await run.browser.context.newCDPSession(page);
    await cdp.send('Emulation.setTimezoneOverride', { timezoneId: ZONE });
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInThroughPage(page, run.gyre.baseUrl, MONITOR.email, '/ledger');
    await page.getByText('The trail is intact').waitFor();
    return { page, problems };
  }

  it('reads a flag entry as a sentence that links to the visit, with times in the stated zone', async () => {
    const { page, problems } = await monitorPage();
    const sentence = `${ANALYST.name} raised a slowing flag on ${flagged.code} · ${flaggedVisit.label}: ${FLAG_REASON}`;
    const flagEntry = page.getByRole('article').filter({ hasText: sentence });
    await flagEntry.waitFor();
    await expect(page.getByText(`Times are shown in ${ZONE} (UTC+01:00)`).count()).resolves.toBe(1);
    // Each time carries the zone's short name (December in Berlin: CET).
    await expect(flagEntry.locator('time').innerText()).resolves.toMatch(/\d\d:\d\d:\d\d CET$/);
    // The other study's entries fall between this study's: the jump is explained.
    await page
      .getByText(/entries outside your access/)
      .first()
      .waitFor();
    await page.getByRole('note', { name: 'Why entry numbers jump' }).waitFor();

    await flagEntry.getByRole('button', { name: 'Details' }).click();
    const changes = page.getByRole('table', { name: /^Changes in entry/ });
    await changes.getByText('Reason for raising').waitFor();
    await expect(changes.getByText('(none)').count()).resolves.toBe(0);
    await screenshot(page, 'ledger-monitor-1440');

    // "Check again": the button shows it works, then a message with the time and the result.
    await page.getByRole('button', { name: 'Check again' }).click();
    await page.getByText(/^Checked .* CET: intact, \d+ entries checked\.$/).waitFor();
    await screenshot(page, 'ledger-monitor-check-again');

    expect(problems).toEqual([]);
    // The link opens the visit in Review (whose own requests are its own test's business).
    await flagEntry.getByRole('link', { name: `${flagged.code} · ${flaggedVisit.label}` }).click();
    await page.getByText(`Review · ${flagged.code} · ${flaggedVisit.label}`).waitFor();
    expect(new URL(page.url()).pathname).toBe(`/review/${flaggedVisit.id}`);
    await page.close();
  });

  it('filters by participant, chosen by code', async () => {
    const { page, problems } = await monitorPage();
    await page.getByRole('article').first().waitFor();
    await page.getByLabel('Participant').click();
    await page.getByLabel('Participant').fill(flagged.code);
    await page.getByTitle(flagged.code, { exact: true }).click();
    await page.waitForURL((url) => url.searchParams.get('participantId') === flagged.id);
    // Only entries about EC-0001: its creation, its visit and the flag.
    await page.getByText('3 entries', { exact: true }).waitFor();
    const texts = await page.getByRole('article').allInnerTexts();
    expect(texts).toHaveLength(3);
    expect(texts.every((text) => text.includes(flagged.code))).toBe(true);
    expect(texts.some((text) => text.includes(other.code))).toBe(false);
    await screenshot(page, 'ledger-monitor-participant');
    expect(problems).toEqual([]);
    await page.close();
  });

  it('fits a 390 px screen: nothing wider than the window, dates named apart', async () => {
    const { page, problems } = await monitorPage();
    await page.setViewportSize({ width: 390, height: 844 });
    const flagEntry = page.getByRole('article').filter({ hasText: 'raised a slowing flag' });
    await flagEntry.waitFor();
    await flagEntry.getByRole('button', { name: 'Details' }).click();
    await page.getByRole('table', { name: /^Changes in entry/ }).waitFor();
    await flagEntry.getByText('Recorded data').click();
    await flagEntry.getByText('Links to').waitFor();
    await expectFitsWindow(page, 'Audit ledger at 390 px');
    await expect(page.getByLabel('From date').count()).resolves.toBe(1);
    await expect(page.getByLabel('To date').count()).resolves.toBe(1);
    // Every button of the screen has a name a screen reader can say.
    const unnamed = await page.evaluate(() =>
      [...(document.querySelector('main') ?? document).querySelectorAll('button')]
        .filter((button) => {
          if (
            button.getClientRects().length === 0 ||
            getComputedStyle(button).visibility === 'hidden' ||
            button.closest('[hidden]') !== null
          ) {
            return false;
          }
          // The accessible name from aria-label, text, or a labelled icon inside.
          const labelled = [...button.querySelectorAll('[aria-label]')].map((e) =>
            e.getAttribute('aria-label'),
          );
          const name = [button.getAttribute('aria-label'), button.textContent, ...labelled]
            .join('')
            .trim();
          return name === '' && button.getAttribute('aria-labelledby') === null;
        })
        .map((button) => button.outerHTML.slice(0, 120)),
    );
    expect(unnamed).toEqual([]);
    await screenshot(page, 'ledger-monitor-390');
    expect(problems).toEqual([]);
    await page.close();
  });
});
