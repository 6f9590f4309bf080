import type { CDPSession, Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { createFirstAdmin, E2E_PASSWORD } from './support/accounts';
import { watchConsole, openFromMainMenu } from './support/browser';
import { gyreInChromium } from './support/gyre-server';
import { signInThroughPage } from './support/sign-in-page';

// Generated test account of an empty installation.
const ADMIN = { email: 'lena.admin@gyre.test', name: 'Lena Admin', password: E2E_PASSWORD };

/** Every response 400 ms late, from the browser's own cache or not: each screen's code is slow. */
async function slowNetwork(page: Page): Promise<CDPSession> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
  await cdp.send('Network.emulateNetworkConditions', {
    offline: false,
    latency: 400,
    downloadThroughput: -1,
    uploadThroughput: -1,
  });
  return cdp;
}

/**
 * Records, in the page from its first script on, each of these states the first time it is on
 * screen, in order: what a deep link may show on its way to a screen, and what it must not.
 */
const STATES = `window.gyreSeen = [];
new MutationObserver(() => {
  const states = {
    'opening Gyre': () => document.querySelector('[aria-label="Opening Gyre"]'),
    'signing in': () => document.querySelector('[aria-label="Signing you in"]'),
    'sign-in form': () => document.querySelector('input[type="password"]'),
    'no such page': () => [...document.querySelectorAll('*')].find((e) => e.textContent === 'No such page'),
    'the Ledger': () => [...document.querySelectorAll('h2')].find((e) => e.textContent === 'Ledger'),
  };
  for (const [name, find] of Object.entries(states)) {
    if (!window.gyreSeen.includes(name) && find()) window.gyreSeen.push(name);
  }
}).observe(document, { childList: true, subtree: true });`;

describe('screens whose code is still on its way, in Chromium', () => {
  const run = gyreInChromium();

  beforeAll(async () => {
    await createFirstAdmin(run.gyre.dataDir, ADMIN);
  });

  /** A new page signed in as the admin on the start screen, its network slowed from then on. */
  async function adminOnSlowNetwork() {
    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    await signInThroughPage(page, run.gyre.baseUrl, ADMIN.email, '/');
    await page.getByText(/^Welcome, /).waitFor();
    await slowNetwork(page);
    return { page, problems };
  }

  it('keeps the screen being left, under a progress bar, until the next one is ready', async () => {
    const { page, problems } = await adminOnSlowNetwork();
    await openFromMainMenu(page, 'Team');
    const progress = page.getByRole('progressbar', { name: 'Opening the screen' });
    await progress.waitFor();
    // The start screen stays while Team's code arrives: no blank window, no other screen.
    await expect(page.getByText(/^Welcome, /).isVisible()).resolves.toBe(true);
    await page.getByText(ADMIN.email).waitFor();
    await expect(progress.count()).resolves.toBe(0);
    expect(problems).toEqual([]);
    await page.close();
  });

  it('opens a deep link through a loading outline, never the sign-in form or another page', async () => {
    const { page, problems } = await adminOnSlowNetwork();
    await page.addInitScript(STATES);
    // A full load: the session is renewed with the refresh cookie, the code fetched again.
    await page.goto(`${run.gyre.baseUrl}/ledger`);
    await page.getByRole('heading', { name: 'Ledger', level: 2 }).waitFor();
    await page.getByRole('note', { name: 'Research use caution' }).waitFor();
    const seen = await page.evaluate('window.gyreSeen');
    expect(seen).toEqual(['opening Gyre', 'signing in', 'the Ledger']);
    expect(problems).toEqual([]);
    await page.close();
  });
});
