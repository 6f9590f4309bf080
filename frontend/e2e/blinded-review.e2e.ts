import { describe, expect, it } from 'vitest';
import type { ParticipantView, StudyView, VisitView } from '@gyre/shared';
import { api, E2E_PASSWORD } from './support/accounts';
import { addParticipant, addVisit, setUpStudy, uploadComputed } from './support/study-data';
import { signInThroughPage } from './support/sign-in-page';
import { screenshot, watchConsole } from './support/browser';
import { gyreInChromium } from './support/gyre-server';

// Generated test accounts and data of an invented study.
const ADMIN = { email: 'bea.admin@gyre.test', name: 'Bea Admin', password: E2E_PASSWORD };
const TECHNICIAN = { email: 'tom.tech@gyre.test', name: 'Tom Tech' };
const ANALYST = { email: 'ada.analyst@gyre.test', name: 'Ada Analyst' };
const VISIT_DATE = '2025-04-09';
const NOTICE = 'Blinded review: visit details hidden until you record your decision.';
/** A date as the client writes one (lib/format.ts: `D MMM YYYY`), in any month. */
const ANY_DATE = /\b\d{1,2} (Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{4}\b/;

describe('Blinded review in Chromium, on a real server', () => {
  const run = gyreInChromium((gyre) =>
    setUpStudy(gyre, {
      admin: ADMIN,
      study: { code: 'ALPHA-BLIND', name: 'Alpha blinded (invented)' },
      members: { technician: TECHNICIAN, analyst: ANALYST },
    }),
  );

  it('an analyst sees the code only until recording the decision, then the visit', async () => {
    const { gyre, prepared } = run;
    const tech = prepared.tokenOf('technician');
    const participant: ParticipantView = await addParticipant(gyre, tech, { code: 'BL-0003' });
    const visit: VisitView = await addVisit(gyre, tech, participant, {
      label: 'Month 3',
      visitDate: VISIT_DATE,
    });
    await uploadComputed(gyre, tech, visit, {
      kind: 'resting',
      alphaHz: 10,
      deltaFHz: 0,
      durationS: 60,
      startDate: `${VISIT_DATE}T09:30:00`,
    });
    const study = await api<StudyView>(
      gyre.baseUrl,
      prepared.adminToken,
      'PATCH',
      `/api/studies/${prepared.study.id}`,
      { blindedReview: true, reason: 'Analysts judge visits blind' },
    );
    expect(study.blindedReview).toBe(true);

    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    await signInThroughPage(page, gyre.baseUrl, ANALYST.email, '/');
    const worklist = page.getByRole('region', { name: 'Worklist' });
    await worklist.getByRole('note', { name: 'Blinded review' }).waitFor();
    await expect(worklist.innerText()).resolves.toContain(NOTICE);
    const item = worklist.getByRole('link', { name: /^Visit B-/ }).first();
    const label = await item.innerText();
    const code = label.replace('Visit ', '');
    expect(code).toMatch(/^B-[2-9A-HJKMNP-Z]{4}$/);
    const text = await worklist.innerText();
    expect(text).not.toContain('BL-0003');
    expect(text).not.toContain('Month 3');
    // Its time is counted from the first upload: no date, not even 1 Jan 1970.
    expect(text).toContain('first upload');
    expect(text).not.toMatch(ANY_DATE);
    expect(text).not.toContain('1970');
    await screenshot(page, 'blinded-worklist');

    await item.click();
    await page.getByRole('heading', { name: `Review · visit ${code}` }).waitFor();
    await expect(page.getByRole('note', { name: 'Blinded review' }).innerText()).resolves.toContain(
      NOTICE,
    );
    const body = await page.locator('main').innerText();
    expect(body).not.toContain('BL-0003');
    expect(body).not.toContain('Month 3');
    expect(body).not.toMatch(/Trajectory of/);
    // Upload and computation times read as time after the first upload, never as a date.
    const source = page.getByTestId('source-resting');
    await source.getByText(/computed/).waitFor();
    await expect(source.innerText()).resolves.toMatch(
      /uploaded at first upload .*computed (at first upload|\+\d+\s(s|min) after first upload), once the file was accepted/,
    );
    const blindedBody = await page.locator('main').innerText();
    expect(blindedBody).not.toMatch(ANY_DATE);
    expect(blindedBody).not.toContain('1970');
    expect(blindedBody).not.toContain(VISIT_DATE);
    const card = page.locator('[aria-label="Blinded decision"]');
    await card.getByLabel('No flag').check();
    await card.getByLabel('Reason').fill('PAF steady at 10 Hz, nothing to flag');
    await screenshot(page, 'blinded-review');
    await card.getByRole('button', { name: 'Record the decision' }).click();
    await page.getByText(`Review · ${participant.code} · ${visit.label}`).waitFor();
    await expect(page.getByRole('note', { name: 'Blinded review' }).count()).resolves.toBe(0);
    // Now the visit's date and the real upload and computation times show.
    await page.getByText('Visit of 9 Apr 2025').waitFor();
    await expect(page.getByTestId('source-resting').innerText()).resolves.toMatch(
      /uploaded \d{1,2} \w{3} \d{4}, \d\d:\d\d:\d\d .*computed \d{1,2} \w{3} \d{4}, \d\d:\d\d:\d\d, once the file was accepted/,
    );
    const unblindedBody = await page.locator('main').innerText();
    expect(unblindedBody).not.toContain('after first upload');
    expect(unblindedBody).not.toContain('1970');
    expect(problems).toEqual([]);
    await page.close();
  }, 600_000);
});
