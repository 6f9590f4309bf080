import { describe, expect, it } from 'vitest';
import { screenshot, watchConsole } from './support/browser';
import { RESEARCH_CAUTION } from './support/caution';
import { gyreInChromium } from './support/gyre-server';

describe('the built app in Chromium', () => {
  const run = gyreInChromium();

  it('serves the shell with the caution, in IBM Plex Sans, without console errors', async () => {
    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    const response = await page.goto(`${run.gyre.baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    expect(response?.status()).toBe(200);
    await expect(
      page.getByRole('note', { name: 'Research use caution' }).innerText(),
    ).resolves.toContain(RESEARCH_CAUTION);
    await page.evaluate(() => document.fonts.ready);
    const fonts = await page.evaluate(() => {
      const loaded = [...document.fonts]
        .filter((f) => f.status === 'loaded')
        .map((f) => f.family.replace(/["']/g, ''));
      const bodyFamily = getComputedStyle(document.body).fontFamily;
      const usesPlex = document.fonts.check("16px 'IBM Plex Sans'");
      return { loaded, bodyFamily, usesPlex };
    });
    // The font must be loaded from /fonts, not just named: a fallback would leave it unloaded.
    expect(fonts.loaded).toContain('IBM Plex Sans');
    expect(
      fonts.bodyFamily.startsWith("'IBM Plex Sans'") ||
        fonts.bodyFamily.startsWith('"IBM Plex Sans"'),
    ).toBe(true);
    expect(fonts.usesPlex).toBe(true);
    await screenshot(page, 'shell-sign-in');
    expect(problems).toEqual([]);
    await page.close();
  });

  it('falls back to the client for deep links and asks a visitor to sign in first', async () => {
    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    const response = await page.goto(`${run.gyre.baseUrl}/no/such/screen`, {
      waitUntil: 'networkidle',
    });
    expect(response?.status()).toBe(200);
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).searchParams.get('next')).toBe('/no/such/screen');
    // This browser never signed in, so the client did not even ask the server (no 401 logged).
    expect(problems).toEqual([]);
    await page.close();
  });

  it('keeps /api answering JSON, not the client page', async () => {
    const health = await fetch(`${run.gyre.baseUrl}/api/health`);
    expect(health.headers.get('content-type')).toContain('application/json');
    expect(await health.json()).toMatchObject({ status: 'ok', database: { reachable: true } });
    const missing = await fetch(`${run.gyre.baseUrl}/api/does-not-exist`, {
      headers: { accept: 'text/html' },
    });
    expect(missing.status).toBe(404);
    expect(await missing.json()).toMatchObject({ statusCode: 404, code: 'NOT_FOUND' });
  });
});
