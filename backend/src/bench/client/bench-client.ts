/**
 * `npm run bench:client [-- --runs N]`
 *
 * How fast the built client is, for docs/performance.md: a benchmark, not a test. Starts the
 * built server on a fresh data folder, uploads one generated resting and one task recording
 * and waits for their results, then in headless Chromium, each time with a cold cache
 * (default 5 runs after one discarded warm-up):
 * - sign-in: first contentful paint, and when the form's button is on screen;
 * - Review of that visit, signed in: first contentful paint, and when the onset curve is
 *   drawn with the research caution shown.
 * Prints the medians (min–max), the JavaScript each page requested (raw and gzipped, from the
 * built files) and the load average before and after. Needs the built backend and client.
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { RecordingView } from '@gyre/shared';
import { chromium } from 'playwright-core';
import { openServerDatabase } from '../../robustness/crash/server-database';
import { machineDescription } from '../../robustness/cli/fuzz';
import { CRASH_PASSWORD, seedCrashData } from '../../robustness/crash/crash-seed';
import { GyreClient } from '../../robustness/crash/gyre-client';
import { QUICK_SIZES, restingUpload, taskUpload } from '../../robustness/crash/recording-files';
import { sleep, startServer, stopServer } from '../../robustness/crash/server-process';
import { Rng } from '../../robustness/seeded-random';
import { reviewCold, signInCold, type PageLoad } from './client-timings';
import { firstLoadOf, type FirstLoad } from './first-load';
import { exitWith } from '../../robustness/cli/exit-with';

const JWT_SECRET = 'gyre-client-bench-secret-0123456789abcdefghijkl';
const CLIENT_DIR = resolve(__dirname, '..', '..', '..', '..', 'frontend', 'dist');

function runsOption(argv: readonly string[]): number {
  const at = argv.indexOf('--runs');
  if (at === -1) return 5;
  const value = Number(argv[at + 1]);
  if (!Number.isSafeInteger(value) || value < 1) throw new Error('--runs: a positive integer');
  return value;
}

function loadAverage(): string {
  return loadavg()
    .map((value) => value.toFixed(2))
    .join(', ');
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

function spread(values: readonly number[]): string {
  const ms = (value: number) => `${Math.round(value)} ms`;
  return `${ms(median(values))} (${ms(Math.min(...values))}–${ms(Math.max(...values))})`;
}

function describeLoad(route: string, load: FirstLoad): string[] {
  const kb = (bytes: number) => `${(bytes / 1000).toFixed(1)} kB`;
  return [
    `  ${route}: ${load.files.length} JS files, ${kb(load.rawBytes)} raw, ${kb(load.gzipBytes)} gzipped`,
    ...load.files.map((f) => `    ${f.path}  ${kb(f.rawBytes)} raw, ${kb(f.gzipBytes)} gzipped`),
  ];
}

/** Uploads a resting and a task recording to the visit and waits until both are ready. */
async function computedVisit(client: GyreClient, visitId: string): Promise<void> {
  const rng = new Rng(20260115);
  const uploads = [restingUpload(rng, QUICK_SIZES, 1), taskUpload(rng, QUICK_SIZES, 2)];
  const ids: string[] = [];
  for (const file of uploads) {
    const response = await client.upload(visitId, file);
    if (response.status !== 201 || response.body === null) {
      throw new Error(`upload of the ${file.kind} recording: HTTP ${response.status}`);
    }
    ids.push(response.body.id);
  }
  const deadline = Date.now() + 300_000;
  // Twice ready in a row: a task computed before its resting IAF is computed again.
  for (let settled = 0; settled < 2;) {
    const states = await Promise.all(
      ids.map(async (id) => {
        const now = await client.call<RecordingView>('GET', `/api/recordings/${id}`, 'analyst');
        return now.body?.state ?? `HTTP ${now.status}`;
      }),
    );
    const bad = states.find((state) => state === 'failed' || state === 'rejected');
    if (bad !== undefined) throw new Error(`a generated recording was ${bad}`);
    settled = states.every((state) => state === 'ready') ? settled + 1 : 0;
    if (Date.now() > deadline) throw new Error(`recordings not ready: ${states.join(', ')}`);
    await sleep(1000);
  }
}

async function main(): Promise<number> {
  const runs = runsOption(process.argv.slice(2));
  if (!existsSync(join(CLIENT_DIR, 'index.html'))) {
    console.error(`bench:client: no built client in ${CLIENT_DIR}; run npm run build first`);
    return 2;
  }
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-bench-client-'));
  const server = await startServer(dataDir, JWT_SECRET, join(dataDir, 'server.log'));
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--disable-background-networking'],
  });
  try {
    const dataSource = await openServerDatabase(dataDir);
    const seed = await seedCrashData(dataSource, 1).finally(() => dataSource.destroy());
    const client = new GyreClient(server.url, seed.emails);
    await client.connect(server.url);
    await computedVisit(client, seed.visitIds[0]);
    const reviewPath = `/review/${seed.visitIds[0]}`;

    const analyst = { email: seed.emails.analyst, password: CRASH_PASSWORD };
    const loadBefore = loadAverage();
    const signIns: PageLoad[] = [];
    const reviews: PageLoad[] = [];
    for (let run = 0; run <= runs; run++) {
      const { load, signedIn } = await signInCold(browser, server.url, analyst, reviewPath);
      const review = await reviewCold(browser, server.url, signedIn, reviewPath);
      // Run 0 warms the server (its first answers compile code paths); it is not counted.
      if (run === 0) continue;
      signIns.push(load);
      reviews.push(review);
    }
    const loadAfter = loadAverage();

    console.log(`bench:client: ${runs} cold-cache runs in headless Chromium on loopback`);
    console.log(`  machine: ${machineDescription()}`);
    console.log(`  load average (1, 5, 15 min): ${loadBefore} before, ${loadAfter} after`);
    console.log(`  sign-in first contentful paint: ${spread(signIns.map((l) => l.fcpMs))}`);
    console.log(`  sign-in form ready:             ${spread(signIns.map((l) => l.usableMs))}`);
    console.log(`  Review first contentful paint:  ${spread(reviews.map((l) => l.fcpMs))}`);
    console.log(`  Review usable (chart drawn):    ${spread(reviews.map((l) => l.usableMs))}`);
    console.log('first-load JavaScript (gzip at zlib level 6, as the server compresses):');
    for (const line of describeLoad('sign-in', firstLoadOf(CLIENT_DIR, signIns[0].scripts))) {
      console.log(line);
    }
    for (const line of describeLoad('Review', firstLoadOf(CLIENT_DIR, reviews[0].scripts))) {
      console.log(line);
    }
    return 0;
  } finally {
    await browser.close();
    await stopServer(server, 'SIGTERM');
    rmSync(dataDir, { recursive: true, force: true });
  }
}

if (require.main === module) exitWith(main);
