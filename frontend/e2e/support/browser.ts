import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const SCREENSHOT_DIR = resolve(import.meta.dirname, '..', '..', '..', 'test-results');

export interface OpenBrowser {
  context: BrowserContext;
  close: () => Promise<void>;
}

/** Debian's Chromium, headless, kept off the (closed) network, with a fresh profile. */
export async function openBrowser(): Promise<OpenBrowser> {
  const profile = mkdtempSync(join(tmpdir(), 'gyre-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return {
    context,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Collects console errors and warnings and uncaught page errors. */
export function watchConsole(page: Page): string[] {
  const problems: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error' || message.type() === 'warning') {
      problems.push(`${message.type()}: ${message.text()}`);
    }
  });
  page.on('pageerror', (error) => problems.push(`pageerror: ${error.message}`));
  return problems;
}

/**
 * The user guide's pictures (docs/user-guide.md shows them), written by the layout test. They
 * show the day the test ran, so a plain run writes them beside the other screenshots and only
 * `GYRE_UPDATE_GUIDE=1` replaces the committed ones in docs/user-guide/.
 */
const USER_GUIDE_IMAGE_DIR =
  process.env.GYRE_UPDATE_GUIDE === '1'
    ? resolve(import.meta.dirname, '..', '..', '..', 'docs', 'user-guide')
    : join(SCREENSHOT_DIR, 'user-guide');

/** A full-page picture of the screen in test-results/ (for a person reading a failure). */
export async function screenshot(page: Page, name: string): Promise<string> {
  return capture(page, join(SCREENSHOT_DIR, `${name}.png`), { fullPage: true });
}

/**
 * A picture for the user guide, `name`.png (see USER_GUIDE_IMAGE_DIR): what the window shows (not the
 * whole page), so each stays small (under 150 KB at 1280 × 800).
 */
export async function userGuideImage(page: Page, name: string): Promise<string> {
  return capture(page, join(USER_GUIDE_IMAGE_DIR, `${name}.png`), { fullPage: false });
}

async function capture(page: Page, file: string, options: { fullPage: boolean }): Promise<string> {
  mkdirSync(dirname(file), { recursive: true });
  // Let fades settle so the picture shows the screen, not a transition (endless spinners aside).
  await page
    .waitForFunction(
      () =>
        document
          .getAnimations()
          .every(
            (animation) =>
              animation.playState !== 'running' ||
              animation.effect?.getTiming().iterations === Infinity,
          ),
      undefined,
      { timeout: 3000 },
    )
    .catch(() => undefined);
  await page.screenshot({ path: file, fullPage: options.fullPage });
  return file;
}

/** Opens `name` from the app's main menu (the navigation landmark named Main). */
export async function openFromMainMenu(page: Page, name: string): Promise<void> {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name }).click();
}
