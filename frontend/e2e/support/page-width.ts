import type { Page } from 'playwright-core';
import { expect } from 'vitest';

/**
 * Waits (up to `timeoutMs`) for the page to fit its window sideways, then asserts it. Right
 * after a resize, antd's responsive columns, the frame's breakpoints and a closing dropdown
 * settle over a few frames, so one measurement can see the layout of the old width; the
 * failure names the page and window widths and what sticks out.
 */
export async function expectFitsWindow(page: Page, label: string, timeoutMs = 5000): Promise<void> {
  const measure = () =>
    page.evaluate(() => {
      const width = window.innerWidth;
      const sticking = [...document.body.querySelectorAll('*')]
        .filter((el) => el.getBoundingClientRect().right > width + 1)
        .filter((el) => ![...el.children].some((c) => c.getBoundingClientRect().right > width + 1))
        .slice(0, 5)
        .map((el) => `${el.tagName.toLowerCase()}.${String(el.className).slice(0, 60)}`);
      return { page: document.documentElement.scrollWidth, window: width, sticking };
    });
  const deadline = Date.now() + timeoutMs;
  let fit = await measure();
  while (fit.page > fit.window && Date.now() < deadline) {
    await page.waitForTimeout(100);
    fit = await measure();
  }
  expect(
    fit.page,
    `${label}: the page is ${fit.page} px wide in a ${fit.window} px window; sticking out: ${fit.sticking.join('; ')}`,
  ).toBeLessThanOrEqual(fit.window);
}
