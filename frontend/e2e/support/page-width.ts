import type { Page } from 'playwright-core';
import { expect } from 'vitest';

/**
 * The page's width against the window's, and what sticks out of the window sideways: the
 * innermost elements whose right edge passes the window's width (empty when the page fits).
 * Scroll boxes (wide tables) clip their content, so only what widens the page itself counts.
 */
export function sticksOutSideways(
  page: Page,
): Promise<{ page: number; window: number; out: string[] }> {
  return page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    const fit = { page: document.documentElement.scrollWidth, window: width };
    if (fit.page <= width) return { ...fit, out: [] };
    const clipped = (el: Element): boolean => {
      for (let up = el.parentElement; up !== null; up = up.parentElement) {
        if (getComputedStyle(up).overflowX !== 'visible') return true;
      }
      return false;
    };
    const out = [...document.body.querySelectorAll('*')]
      .filter((el) => el.getBoundingClientRect().right > width + 1 && !clipped(el))
      .filter((el) => ![...el.children].some((c) => c.getBoundingClientRect().right > width + 1))
      .slice(0, 5)
      .map(
        (el) =>
          `${el.tagName.toLowerCase()}.${String(el.className)}: ${(el.textContent ?? '').slice(0, 40)}`,
      );
    return { ...fit, out };
  });
}

/**
 * Waits (up to `timeoutMs`) for nothing to stick out of the window sideways, then asserts it.
 * Right after a resize, antd's responsive columns, the frame's switch to the phone menu and a
 * closing dropdown settle over a few frames, so one measurement can see the layout of the old
 * width; the failure names the page and window widths and what sticks out.
 */
export async function expectFitsWindow(page: Page, label: string, timeoutMs = 5000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let fit = await sticksOutSideways(page);
  while (fit.out.length > 0 && Date.now() < deadline) {
    await page.waitForTimeout(100);
    fit = await sticksOutSideways(page);
  }
  expect(
    fit.out,
    `${label}: the page is ${fit.page} px wide in a ${fit.window} px window; sticking out`,
  ).toEqual([]);
}
