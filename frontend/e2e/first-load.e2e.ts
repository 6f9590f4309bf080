import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { watchConsole } from './support/browser';
import { gyreInChromium } from './support/gyre-server';

const CLIENT_DIR = resolve(import.meta.dirname, '..', 'dist');

/** Issue 12 §4's budget for the sign-in page's JavaScript, gzipped; kB as 1000 bytes. */
const SIGN_IN_BUDGET_BYTES = 250 * 1000;

/** Vite's build manifest: which built file holds each source module (vite.config.ts). */
type Manifest = Record<string, { file: string; isEntry?: boolean }>;

function builtFileOf(manifest: Manifest, source: string): string {
  const entry = manifest[source];
  if (entry === undefined) throw new Error(`${source} is not a chunk of the build`);
  return `/${entry.file}`;
}

/** The URL paths of every script `page` requests from now on. */
function recordScripts(page: Page): string[] {
  const scripts: string[] = [];
  page.on('request', (request) => {
    if (request.resourceType() === 'script') scripts.push(new URL(request.url()).pathname);
  });
  return scripts;
}

describe('what the sign-in page downloads, in Chromium', () => {
  const run = gyreInChromium();
  const manifest = JSON.parse(
    readFileSync(join(CLIENT_DIR, '.vite', 'manifest.json'), 'utf8'),
  ) as Manifest;

  it('stays within 250 kB of gzipped JavaScript, without charts or the signed-in frame', async () => {
    const page = await run.browser.context.newPage();
    const problems = watchConsole(page);
    const scripts = recordScripts(page);
    await page.goto(`${run.gyre.baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: 'Sign in' }).waitFor();

    const files = [...new Set(scripts)];
    expect(files.length).toBeGreaterThan(0);
    for (const file of files) expect(file).toMatch(/^\/assets\/[\w-]+\.js$/);
    // Gzip as the server's compression sends it (zlib's default level; RFC 1952 framing).
    const gzipped = files.map((file) => ({
      file,
      bytes: gzipSync(readFileSync(join(CLIENT_DIR, file))).length,
    }));
    const total = gzipped.reduce((sum, { bytes }) => sum + bytes, 0);
    console.log(
      `sign-in first-load JavaScript: ${files.length} files, ${(total / 1000).toFixed(1)} kB gzipped`,
    );
    expect(total).toBeLessThanOrEqual(SIGN_IN_BUDGET_BYTES);

    // What sign-in has no use for stays on the server until a signed-in screen asks for it.
    expect(files).not.toContain(builtFileOf(manifest, 'src/components/charts/g2-plot.tsx'));
    expect(files).not.toContain(builtFileOf(manifest, 'src/app/session-gate.tsx'));
    expect(files).not.toContain(
      builtFileOf(manifest, 'src/features/review/components/review-page.tsx'),
    );
    expect(problems).toEqual([]);
    await page.close();
  });

  it('caches the hashed build for a year, revalidates the page, and serves no source maps', async () => {
    const entry = Object.values(manifest).find((chunk) => chunk.isEntry === true);
    expect(entry).toBeDefined();
    const page = await fetch(`${run.gyre.baseUrl}/review/some-visit`, {
      headers: { accept: 'text/html' },
    });
    expect(page.status).toBe(200);
    // RFC 9111 §5.2.2.4 (no-cache); RFC 9111 §5.2.2.1 with RFC 8246 (a year, immutable).
    expect(page.headers.get('cache-control')).toBe('no-cache');
    expect(await page.text()).toContain(`/${entry?.file}`);
    const script = await fetch(`${run.gyre.baseUrl}/${entry?.file}`);
    expect(script.status).toBe(200);
    expect(script.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    expect(await script.text()).not.toContain('sourceMappingURL');
    const map = await fetch(`${run.gyre.baseUrl}/${entry?.file}.map`);
    expect(map.status).toBe(404);
    const manifestAnswer = await fetch(`${run.gyre.baseUrl}/.vite/manifest.json`);
    expect(await manifestAnswer.text()).not.toContain('"file"');
  });
});
