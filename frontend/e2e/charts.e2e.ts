import type { Locator, Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { screenshot, watchConsole } from './support/browser';
import { gyreInChromium } from './support/gyre-server';
import { signInThroughPage } from './support/sign-in-page';
import { setUpInventedStudy, type InventedStudy } from './support/study-data';

// Generated test accounts of an invented study.
const PEOPLE: InventedStudy['people'] = {
  admin: { email: 'cora.admin@gyre.test', name: 'Cora Admin' },
  technician: { email: 'tess.tech@gyre.test', name: 'Tess Tech' },
  analyst: { email: 'abe.analyst@gyre.test', name: 'Abe Analyst' },
  monitor: { email: 'mona.monitor@gyre.test', name: 'Mona Monitor' },
  coordinator: { email: 'cole.coord@gyre.test', name: 'Cole Coordinator' },
};

const MINUS = '\u2212';

/** The tick labels a chart's figure hands to the page (the chart itself is a canvas). */
async function tickLabels(figure: Locator, axis: 'x' | 'y'): Promise<string[]> {
  const raw = await figure.locator('[data-gyre-chart]').getAttribute(`data-${axis}-ticks`);
  return JSON.parse(raw ?? '[]') as string[];
}

/** Whether two boxes share any area. */
function overlaps(
  a: { x: number; y: number; width: number; height: number },
  b: { x: number; y: number; width: number; height: number },
): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

/** Every canvas and svg inside the figure stays inside it and inside the window. */
async function expectInside(page: Page, figure: Locator): Promise<void> {
  const viewport = page.viewportSize()!;
  const frame = (await figure.boundingBox())!;
  expect(frame.x).toBeGreaterThanOrEqual(0);
  expect(frame.x + frame.width).toBeLessThanOrEqual(viewport.width + 0.5);
  for (const part of await figure.locator('canvas').all()) {
    const box = (await part.boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(frame.x + frame.width + 0.5);
  }
}

describe('chart axes and labels in Chromium, on a real server', () => {
  const run = gyreInChromium();
  let invented: InventedStudy;
  /** Signs the study's analyst in through the page, landing on `path`. */
  const signInAsAnalyst = (page: Page, path: string) =>
    signInThroughPage(page, run.gyre.baseUrl, PEOPLE.analyst.email, path);

  beforeAll(async () => {
    invented = await setUpInventedStudy(run.gyre, PEOPLE);
  }, 600_000);

  for (const width of [390, 1440]) {
    it(`Review at ${width} px: distinct tick labels, −1.0 s labelled, window names apart`, async () => {
      const page = await run.browser.context.newPage();
      const problems = watchConsole(page);
      await page.setViewportSize({ width, height: 900 });
      await signInAsAnalyst(page, `/review/${invented.visit.id}`);
      const onset = page.getByRole('figure', { name: 'Onset curve' });
      // The chart's own element, with its ticks, once the lazy chart code has come.
      await onset.locator('[data-gyre-chart][data-x-ticks]').waitFor({ timeout: 60_000 });
      await onset.locator('canvas').first().waitFor({ timeout: 60_000 });

      const x = await tickLabels(onset, 'x');
      const y = await tickLabels(onset, 'y');
      // The epoch runs from −1 to +2 s (the default settings): both ends labelled.
      expect(x[0]).toBe(`${MINUS}1.0`);
      expect(x[x.length - 1]).toBe('+2.0');
      expect(new Set(x).size).toBe(x.length);
      expect(new Set(y).size).toBe(y.length);
      expect(y.length).toBeGreaterThanOrEqual(3);
      expect([...x, ...y].join(' ')).not.toMatch(/(^|\s)-/);

      // Baseline and Post are named in the key, apart from each other.
      const baseline = (await page.locator('[data-gyre-key="baseline"]').boundingBox())!;
      const post = (await page.locator('[data-gyre-key="post"]').boundingBox())!;
      expect(overlaps(baseline, post)).toBe(false);
      await expect(page.locator('[data-gyre-key="baseline"]').innerText()).resolves.toBe(
        `Baseline ${MINUS}0.5 to 0.0\u00a0s`,
      );
      await expectInside(page, onset);

      const spectrum = page.getByRole('figure', { name: 'Rest spectrum' });
      await spectrum.locator('[data-gyre-chart][data-y-ticks]').waitFor({ timeout: 60_000 });
      const power = await tickLabels(spectrum, 'y');
      expect(new Set(power).size).toBe(power.length);
      // One notation: every power label a plain decimal, or every one in E notation.
      const plain = power.filter((label) => /^\d+(\.\d+)?$/.test(label));
      expect([0, power.length]).toContain(plain.length);
      await expectInside(page, spectrum);
      await expectInside(page, page.getByRole('figure', { name: 'Trial raster' }));

      await screenshot(page, `charts-review-${width}`);
      expect(problems).toEqual([]);
      await page.close();
    });
  }

  it('Participant at 390 px: date ticks name each month or year once', async () => {
    const page = await run.browser.context.newPage();
    await page.setViewportSize({ width: 390, height: 900 });
    await signInAsAnalyst(page, `/participants/${invented.participant.id}`);
    const alpha = page.getByRole('figure', { name: 'Alpha frequency trajectory' });
    await alpha.locator('[data-gyre-chart][data-x-ticks]').waitFor({ timeout: 60_000 });
    const dates = await tickLabels(alpha, 'x');
    expect(dates.length).toBeGreaterThan(0);
    expect(new Set(dates).size).toBe(dates.length);
    // The year is written on the first tick and where it changes, never twice in a row.
    expect(dates.filter((label) => /\b2025$/.test(label)).length).toBeLessThanOrEqual(1);
    await expectInside(page, alpha);
    await screenshot(page, 'charts-participant-390');
    await page.close();
  });
});
