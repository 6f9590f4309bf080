import type { Page } from 'playwright-core';
import { E2E_PASSWORD } from './accounts';

/**
 * Signs in on the sign-in page and lets it bring the user on to `next` (path and query): a
 * full page load would drop the in-memory access token; the product's own return path keeps it.
 */
export async function signInThroughPage(
  page: Page,
  baseUrl: string,
  email: string,
  next: string,
): Promise<void> {
  await page.goto(`${baseUrl}/sign-in?next=${encodeURIComponent(next)}`, {
    waitUntil: 'networkidle',
  });
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(E2E_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  const path = next.split('?')[0];
  await page.waitForURL((url) => url.pathname === path);
}
