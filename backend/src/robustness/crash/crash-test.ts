/**
 * The crash test: the built server is SIGKILLed at seeded moments while clients upload and
 * analysts re-run, restarted on the same DATA_DIR each time, and finally left to settle and
 * checked (crash-checks.ts). The schedule (actions, files, kill moments) is seeded; thread and
 * disk timing are not, so two runs with one seed are alike rather than identical: the seed
 * and the server log are printed, and the data folder is kept when a check fails.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { DataSource } from 'typeorm';
import { openServerDatabase } from './server-database';
import { Rng } from '../seeded-random';
import { CheckResult, checkAfterCrashes, countBy, isSettled } from './crash-checks';
import { seedCrashData } from './crash-seed';
import { CrashWorkload } from './crash-workload';
import { GyreClient } from './gyre-client';
import type { UploadSizes } from './recording-files';
import { ServerProcess, sleep, startServer, stopServer } from './server-process';

export type KillMoment = 'upload' | 'computing' | 'random';

export interface KillRecord {
  life: number;
  moment: KillMoment;
  /** Milliseconds the server had been serving when it was killed. */
  aliveMs: number;
  /** Recordings per state and jobs running, read from the database just before the kill. */
  recordingsAtKill: Record<string, number>;
  jobsRunningAtKill: number;
  uploadsInFlight: number;
  restartMs: number;
}

/** What a probe gets: the settled server's client, the database, the data folder, free visits. */
export interface ProbeContext {
  client: GyreClient;
  dataSource: DataSource;
  dataDir: string;
  visitIds: string[];
}

/** Visits kept out of the clients' reach, for the probe. */
const PROBE_VISITS = 4;

export interface CrashTestOptions {
  seed: number;
  kills: number;
  sizes: UploadSizes;
  visits?: number;
  settleTimeoutMs?: number;
  keepData?: boolean;
  log?: (line: string) => void;
  /** Runs on the settled server after the checks (for reproducers of known bugs). */
  probe?: (context: ProbeContext) => Promise<unknown>;
}

export interface CrashTestReport {
  seed: number;
  dataDir: string;
  logFile: string;
  kills: KillRecord[];
  uploads: { attempted: number; byStatus: Record<string, number> };
  reruns: { requested: number; byStatus: Record<string, number> };
  failedBeforeRetry: number;
  retries: Record<string, number>;
  jobs: { total: number; withMoreThanOneAttempt: number; maxAttempts: number };
  settleMs: number;
  wallMs: number;
  check: CheckResult;
  probe: unknown;
}

const JWT_SECRET = 'gyre-crash-test-secret-0123456789abcdefghijkl';
const KILL_WAIT_LIMIT_MS = 8000;

const KILL_MOMENTS: ReadonlyArray<readonly [KillMoment, number]> = [
  ['upload', 3],
  ['computing', 4],
  ['random', 3],
];

async function waitUntil(
  condition: () => Promise<boolean> | boolean,
  timeoutMs: number,
  pollMs = 20,
): Promise<boolean> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (await condition()) return true;
    await sleep(pollMs);
  }
  return false;
}

export async function runCrashTest(options: CrashTestOptions): Promise<CrashTestReport> {
  const log = options.log ?? (() => undefined);
  const started = performance.now();
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-crash-'));
  const logFile = join(dataDir, 'crash-test-server.log');
  const rng = new Rng(options.seed);
  const visits = options.visits ?? options.kills * 4 + 12;
  let server: ServerProcess | null = await startServer(dataDir, JWT_SECRET, logFile);
  const dataSource = await openServerDatabase(dataDir);
  let keep = options.keepData ?? false;
  try {
    const seed = await seedCrashData(dataSource, visits + PROBE_VISITS);
    const probeVisitIds = seed.visitIds.slice(visits);
    const client = new GyreClient(server.url, seed.emails);
    await client.connect(server.url);
    const workload = new CrashWorkload(
      client,
      seed.visitIds.slice(0, visits),
      options.seed,
      options.sizes,
    );
    const actors = [workload.actor(), workload.actor()];
    const kills: KillRecord[] = [];
    let aliveSince = performance.now();

    for (let life = 1; life <= options.kills; life++) {
      const moment = rng.weighted(KILL_MOMENTS);
      if (moment === 'upload') {
        // Into the request: streaming, validating in the lane, or accepting.
        await Promise.race([workload.nextUploadStart(), sleep(KILL_WAIT_LIMIT_MS)]);
        await sleep(rng.int(0, 150));
      } else if (moment === 'computing') {
        await waitUntil(
          async () => ((await countBy(dataSource, 'recording')).computing ?? 0) > 0,
          KILL_WAIT_LIMIT_MS,
        );
        await sleep(rng.int(0, 1200));
      } else {
        await sleep(rng.int(300, 3500));
      }
      const recordingsAtKill = await countBy(dataSource, 'recording');
      const jobsRunningAtKill = (await countBy(dataSource, 'job')).running ?? 0;
      const uploadsInFlight = workload.uploadsInFlight;
      workload.pause();
      await stopServer(server, 'SIGKILL');
      const aliveMs = performance.now() - aliveSince;
      server = null;
      const restarting = performance.now();
      server = await startServer(dataDir, JWT_SECRET, logFile);
      await client.connect(server.url);
      const restartMs = performance.now() - restarting;
      aliveSince = performance.now();
      kills.push({
        life,
        moment,
        aliveMs,
        recordingsAtKill,
        jobsRunningAtKill,
        uploadsInFlight,
        restartMs,
      });
      log(
        `kill ${life}/${options.kills} (${moment}) after ${(aliveMs / 1000).toFixed(1)} s: ` +
          `${JSON.stringify(recordingsAtKill)}, ${jobsRunningAtKill} job(s) running, ` +
          `${uploadsInFlight} upload(s) in flight; back in ${(restartMs / 1000).toFixed(1)} s`,
      );
      workload.resume();
    }

    // No more kills: the clients stop, and the server works through what is left.
    workload.stop();
    await Promise.all(actors);
    const settling = performance.now();
    const settleTimeoutMs = options.settleTimeoutMs ?? 300_000;
    let settled = await waitUntil(() => isSettled(dataSource), settleTimeoutMs, 250);
    const failed = (
      (await dataSource.query(`SELECT "id" FROM "recording" WHERE "state" = 'failed'`)) as Array<{
        id: string;
      }>
    ).map((r) => r.id);
    // Failed after its attempts: the promise is "retry possible", so a retry must work.
    const retries: Record<string, number> = {};
    for (const id of failed) {
      const response = await client.call('POST', `/api/recordings/${id}/retry`, 'technician');
      retries[response.status] = (retries[response.status] ?? 0) + 1;
    }
    if (failed.length > 0) {
      settled = await waitUntil(() => isSettled(dataSource), settleTimeoutMs, 250);
    }
    const settleMs = performance.now() - settling;
    if (!settled) log(`not settled after ${settleTimeoutMs} ms`);

    const auditVerify = await client.call<{ intact?: boolean; checked?: number }>(
      'GET',
      '/api/audit/verify',
      'monitor',
    );
    const check = await checkAfterCrashes({
      dataSource,
      dataDir,
      uploads: workload.figures.uploads,
      auditVerify,
    });
    const jobRows = (await dataSource.query(`SELECT "attempts" FROM "job"`)) as Array<{
      attempts: number;
    }>;
    const byStatus: Record<string, number> = {};
    for (const u of workload.figures.uploads) {
      const key = u.status === 0 ? 'cut off' : String(u.status);
      byStatus[key] = (byStatus[key] ?? 0) + 1;
    }
    keep ||= check.problems.length > 0;
    const wallMs = performance.now() - started;
    const probe =
      options.probe === undefined
        ? null
        : await options.probe({ client, dataSource, dataDir, visitIds: probeVisitIds });
    return {
      seed: options.seed,
      dataDir,
      logFile,
      kills,
      uploads: { attempted: workload.figures.uploads.length, byStatus },
      reruns: workload.figures.reruns,
      failedBeforeRetry: failed.length,
      retries,
      jobs: {
        total: jobRows.length,
        withMoreThanOneAttempt: jobRows.filter((j) => j.attempts > 1).length,
        maxAttempts: Math.max(0, ...jobRows.map((j) => j.attempts)),
      },
      settleMs,
      wallMs,
      check,
      probe,
    };
  } catch (error) {
    keep = true;
    throw error;
  } finally {
    if (server !== null) await stopServer(server, 'SIGTERM');
    await dataSource.destroy();
    if (!keep) rmSync(dataDir, { recursive: true, force: true });
  }
}

const MOMENT_NAMES: Record<KillMoment, string> = {
  upload: 'an upload in flight',
  computing: 'a computation',
  random: 'a random moment',
};

/** The report as printed by `npm run crash-test` (and quoted in docs/reliability.md). */
export function formatCrashReport(report: CrashTestReport, machine: string): string {
  const lines: string[] = [];
  const byMoment: Record<string, number> = {};
  for (const k of report.kills) byMoment[k.moment] = (byMoment[k.moment] ?? 0) + 1;
  const transient = (k: KillRecord): number =>
    ['received', 'validating', 'queued', 'computing'].reduce(
      (n, s) => n + (k.recordingsAtKill[s] ?? 0),
      0,
    );
  const restarts = report.kills.map((k) => k.restartMs).sort((a, b) => a - b);
  lines.push(`Crash test: seed ${report.seed}, ${machine}`);
  lines.push(
    `  kills: ${report.kills.length} SIGKILLs (${Object.entries(byMoment)
      .map(([m, n]) => `${n} aimed at ${MOMENT_NAMES[m as KillMoment]}`)
      .join(
        ', ',
      )}); at the kills ${report.kills.reduce((n, k) => n + k.jobsRunningAtKill, 0)} jobs were running, ` +
      `${report.kills.reduce((n, k) => n + k.uploadsInFlight, 0)} uploads in flight, ` +
      `${report.kills.reduce((n, k) => n + transient(k), 0)} recordings in a transient state`,
  );
  if (restarts.length > 0) {
    lines.push(
      `  restart to first answer: median ${(restarts[Math.floor(restarts.length / 2)] / 1000).toFixed(1)} s, max ${(restarts[restarts.length - 1] / 1000).toFixed(1)} s`,
    );
  }
  lines.push(
    `  uploads: ${report.uploads.attempted} attempted: ${Object.entries(report.uploads.byStatus)
      .map(
        ([s, n]) =>
          `${n} ${s === '201' ? 'accepted (201)' : s === '422' ? 'refused as bad (422)' : s}`,
      )
      .join(', ')}`,
  );
  lines.push(
    `  cut-off uploads ended: ${
      Object.entries(report.check.interrupted)
        .map(([s, n]) => `${n} ${s}`)
        .join(', ') || 'none'
    }`,
  );
  lines.push(
    `  re-runs: ${report.reruns.requested} requested (${Object.entries(report.reruns.byStatus)
      .map(([s, n]) => `${n} × ${s === '0' ? 'cut off' : `HTTP ${s}`}`)
      .join(', ')})`,
  );
  lines.push(
    `  jobs: ${report.jobs.total}, ${report.jobs.withMoreThanOneAttempt} needed more than one attempt (max ${report.jobs.maxAttempts}); ` +
      `${report.failedBeforeRetry} recording(s) failed after three attempts and were retried (${
        Object.entries(report.retries)
          .map(([s, n]) => `${n} × HTTP ${s}`)
          .join(', ') || 'none'
      })`,
  );
  lines.push(
    `  final states: ${Object.entries(report.check.finalStates)
      .sort()
      .map(([s, n]) => `${n} ${s}`)
      .join(', ')}; ${report.check.storedFiles} stored files checked against their SHA-256; ` +
      `audit chain ${report.check.auditEntriesChecked} entries`,
  );
  lines.push(
    `  time: ${(report.wallMs / 1000).toFixed(0)} s in all, ${(report.settleMs / 1000).toFixed(1)} s to settle after the last restart`,
  );
  if (report.check.problems.length === 0) {
    lines.push('  every check held');
  } else {
    lines.push(`  PROBLEMS (${report.check.problems.length}):`);
    for (const p of report.check.problems) lines.push(`    ${p}`);
    lines.push(`  data kept in ${report.dataDir} (server log: ${report.logFile})`);
  }
  return lines.join('\n');
}
