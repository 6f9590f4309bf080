/**
 * Cold-cache page loads in headless Chromium, timed by the page's own Performance API
 * (`performance.now()` counts from the navigation's time origin; first-contentful-paint is
 * the browser's paint timing entry). Each load runs in a fresh browser context, which starts
 * with an empty HTTP cache. The in-page checks are plain text because the backend compiles
 * without the DOM's types.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';

/** A browser context's cookies and local storage, to sign in once and load cold afterwards. */
type StorageState = Awaited<ReturnType<BrowserContext['storageState']>>;

export interface PageLoad {
  /** First contentful paint, ms after navigation start. */
  fcpMs: number;
  /** When the page was usable (see each load), ms after navigation start. */
  usableMs: number;
  /** URL paths of every script the page requested until it was usable. */
  scripts: string[];
}

const FIRST_CONTENTFUL_PAINT = `(() => {
  const entry = performance.getEntriesByName('first-contentful-paint')[0];
  return entry === undefined ? false : entry.startTime;
})()`;

/** The sign-in form is usable once its button is on screen. */
const SIGN_IN_READY = `(() => {
  const ready = [...document.querySelectorAll('button')].some(
    (button) => button.textContent.trim() === 'Sign in' && button.offsetParent !== null,
  );
  return ready ? performance.now() : false;
})()`;

/**
 * Review is usable once the research caution shows and the onset curve's canvas is drawn on
 * (more than 5000 pixels with alpha > 0, the threshold the e2e tests use for "drawn").
 */
const REVIEW_USABLE = `(() => {
  const caution = document.querySelector('[role="note"][aria-label="Research use caution"]');
  const figure = document.querySelector('figure[aria-label="Onset curve"]');
  if (caution === null || figure === null) return false;
  let drawn = 0;
  for (const canvas of figure.querySelectorAll('canvas')) {
    if (canvas.width === 0 || canvas.height === 0) continue;
    const context = canvas.getContext('2d');
    if (context === null) continue;
    const { data } = context.getImageData(0, 0, canvas.width, canvas.height);
    for (let i = 3; i < data.length; i += 4) if (data[i] > 0) drawn += 1;
  }
  return drawn > 5000 ? performance.now() : false;
})()`;

function recordScripts(page: Page): string[] {
  const scripts: string[] = [];
  page.on('request', (request) => {
    if (request.resourceType() === 'script') scripts.push(new URL(request.url()).pathname);
  });
  return scripts;
}

/**
 * Checks `expression` on every animation frame in the page until it gives a number. The loop
 * runs as one evaluation (CDP's, which Gyre's CSP allows: string predicates of
 * `waitForFunction` need 'unsafe-eval').
 */
async function timed(page: Page, expression: string): Promise<number> {
  const loop = `new Promise((resolve) => {
    const tick = () => {
      const value = ${expression};
      if (value === false) requestAnimationFrame(tick);
      else resolve(value);
    };
    tick();
  })`;
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, fail) => {
    timer = setTimeout(() => fail(new Error('the page did not get there in 120 s')), 120_000);
  });
  try {
    return Number(await Promise.race([page.evaluate(loop), timeout]));
  } finally {
    clearTimeout(timer);
  }
}

/**
 * Loads the sign-in page cold, times it, then signs in through the form and lets the client
 * bring the user on to `next`. Returns the timings and the signed-in storage state.
 */
export async function signInCold(
  browser: Browser,
  baseUrl: string,
  account: { email: string; password: string },
  next: string,
): Promise<{ load: PageLoad; signedIn: StorageState }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  try {
    const page = await context.newPage();
    const scripts = recordScripts(page);
    await page.goto(`${baseUrl}/sign-in?next=${encodeURIComponent(next)}`, {
      waitUntil: 'commit',
    });
    const usableMs = await timed(page, SIGN_IN_READY);
    const fcpMs = await timed(page, FIRST_CONTENTFUL_PAINT);
    const load = { fcpMs, usableMs, scripts: [...scripts] };
    await page.getByLabel('E-mail').fill(account.email);
    await page.getByLabel('Password', { exact: true }).fill(account.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => url.pathname === next.split('?')[0], { timeout: 60_000 });
    return { load, signedIn: await context.storageState() };
  } finally {
    await context.close();
  }
}

/** Opens `path` (a Review page) cold while signed in and times it until its chart is drawn. */
export async function reviewCold(
  browser: Browser,
  baseUrl: string,
  signedIn: StorageState,
  path: string,
): Promise<PageLoad> {
  const context = await browser.newContext({
    viewport: { width: 1280, height: 800 },
    storageState: signedIn,
  });
  try {
    const page = await context.newPage();
    const scripts = recordScripts(page);
    await page.goto(`${baseUrl}${path}`, { waitUntil: 'commit' });
    const usableMs = await timed(page, REVIEW_USABLE);
    const fcpMs = await timed(page, FIRST_CONTENTFUL_PAINT);
    return { fcpMs, usableMs, scripts: [...scripts] };
  } finally {
    await context.close();
  }
}
