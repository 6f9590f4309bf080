/**
 * The remote-worker scenario, end to end with the real pieces: a private redis-server, the
 * built server with REDIS_URL on a temporary data folder, N `npm run worker` processes, and
 * uploads of one resting and one task recording per visit through the API. Optionally one
 * worker is SIGKILLed right after it takes a job and started again. Then it checks, from the
 * database and the workers' logs, that every recording was computed exactly once, and what a
 * worker token may read. The test (backend/test/remote-workers-redis.e2e-spec.ts) and the
 * benchmark (`npm run bench:workers`) both run it.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { DataSource } from 'typeorm';
import type { RecordingView } from '@gyre/shared';
import { openServerDatabase } from '../../robustness/crash/server-database';
import { CRASH_PASSWORD, seedCrashData } from '../../robustness/crash/crash-seed';
import { GyreClient } from '../../robustness/crash/gyre-client';
import { sleep, startServer, stopServer } from '../../robustness/crash/server-process';
import type { ServerProcess } from '../../robustness/crash/server-process';
import { startRedisServer } from '../redis-server-process';
import { uploadRecording } from './http-upload';
import { describeSizes, scaleUpload, ScaleSizes } from './scale-uploads';
import { jobsInLog, WorkerProcess } from './worker-process';

export interface ScaleOptions {
  /** One resting and one task recording each. */
  visits: number;
  sizes: ScaleSizes;
  workers: number;
  /** Jobs at once per worker process. */
  concurrency: number;
  /** Start the workers only once every upload is queued (the benchmark measures compute alone). */
  workersAfterUploads: boolean;
  /** SIGKILL the first worker right after it takes a job, then start it again. */
  killOneWorker: boolean;
  /** BullMQ lock and stalled-check period for the workers, ms. */
  lockMs: number;
  stalledIntervalMs: number;
  settleTimeoutMs: number;
  keepData?: boolean;
  log?: (line: string) => void;
}

export interface KillRecord {
  worker: string;
  /** The BullMQ job (`<job>.<attempt>`) the killed worker had just taken. */
  remoteJobId: string;
  /** Workers whose logs say they took that job afterwards, and finished it. */
  takenAgainBy: string[];
  finishedBy: string[];
}

export interface ScaleReport {
  sizes: string;
  recordings: number;
  workers: number;
  concurrency: number;
  /** Seconds from the first upload until the last was accepted. */
  uploadS: number;
  /** Seconds from the workers' start (or the first upload) until every recording was ready. */
  computeS: number;
  wallS: number;
  loadAverage: { before: number[]; after: number[] };
  states: Record<string, number>;
  jobsByWorker: Record<string, { took: number; finished: number }>;
  kill: KillRecord | null;
  /** HTTP status of each request made with the worker token (and one user on the worker API). */
  access: Record<string, number>;
  problems: string[];
  dataDir: string;
}

const JWT_SECRET = 'gyre-scale-test-secret-0123456789abcdefghijkl';

export async function runScaleScenario(options: ScaleOptions): Promise<ScaleReport> {
  const log = options.log ?? (() => undefined);
  const started = performance.now();
  const loadBefore = loadavg();
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-scale-'));
  const serverLog = join(dataDir, 'server.log');
  const redis = await startRedisServer({ appendOnly: true, dir: join(dataDir, 'redis') });
  const workers: WorkerProcess[] = [];
  let server: ServerProcess | null = null;
  let dataSource: DataSource | null = null;
  let keep = options.keepData ?? false;
  try {
    server = await startServer(dataDir, JWT_SECRET, serverLog, 60_000, {
      REDIS_URL: redis.url,
      REMOTE_CHECK_INTERVAL_MS: '2000',
    });
    log(`server ${server.url}, redis ${redis.url}, data ${dataDir}`);
    dataSource = await openServerDatabase(dataDir);
    const seed = await seedCrashData(dataSource, options.visits);
    const client = new GyreClient(server.url, seed.emails);
    await client.connect(server.url);
    const serverUrl = server.url;
    const startWorker = (name: string): WorkerProcess => {
      const worker = new WorkerProcess({
        name,
        redisUrl: redis.url,
        serverUrl,
        dataDir,
        concurrency: options.concurrency,
        lockMs: options.lockMs,
        stalledIntervalMs: options.stalledIntervalMs,
        logFile: join(dataDir, `${name}.log`),
      });
      workers.push(worker);
      return worker;
    };
    const startWorkers = async (): Promise<void> => {
      const fresh = Array.from({ length: options.workers }, (_, i) => startWorker(`w${i + 1}`));
      await Promise.all(
        fresh.map((w) => w.waitForLine((line) => line.includes(': ready:'), 30_000)),
      );
    };

    const killing: { done: Promise<KillRecord | Error> | null } = { done: null };
    const startKilling = (): void => {
      if (!options.killOneWorker) return;
      // Caught here and thrown below, so a failure while uploading is not left unhandled.
      killing.done = killAndRestart(workers[0], startWorker, log).catch((error: unknown) =>
        error instanceof Error ? error : new Error(String(error)),
      );
    };
    let computeFrom = performance.now();
    if (!options.workersAfterUploads) {
      await startWorkers();
      startKilling();
    }

    const signIn = await client.call<{ accessToken: string }>('POST', '/api/auth/sign-in', null, {
      json: { email: seed.emails.technician, password: CRASH_PASSWORD },
    });
    if (signIn.body === null) throw new Error(`technician sign-in: HTTP ${signIn.status}`);
    const technicianToken = signIn.body.accessToken;
    const uploadFrom = performance.now();
    const recordingIds: string[] = [];
    for (let visit = 0; visit < options.visits; visit++) {
      for (const index of [0, 1] as const) {
        const upload = scaleUpload(options.sizes, visit, index);
        const response = await uploadRecording(
          serverUrl,
          technicianToken,
          seed.visitIds[visit],
          upload,
        );
        if (response.status !== 201 || response.body === null) {
          throw new Error(`upload ${upload.description}: HTTP ${response.status}`);
        }
        recordingIds.push((response.body as RecordingView).id);
      }
    }
    const uploadS = (performance.now() - uploadFrom) / 1000;
    log(`${recordingIds.length} recordings uploaded in ${uploadS.toFixed(1)} s`);
    if (options.workersAfterUploads) {
      computeFrom = performance.now();
      await startWorkers();
      startKilling();
    }
    const killed = killing.done === null ? null : await killing.done;
    if (killed instanceof Error) throw killed;
    const kill = killed;
    const settled = await waitUntil(
      async () => (await unsettled(dataSource as DataSource)) === 0,
      options.settleTimeoutMs,
    );
    const computeS = (performance.now() - computeFrom) / 1000;
    log(`settled: ${settled} after ${computeS.toFixed(1)} s of computing`);

    const problems: string[] = settled
      ? []
      : [`recordings or jobs still unsettled after ${options.settleTimeoutMs} ms`];
    problems.push(...(await exactlyOnce(dataSource, recordingIds)));
    if (kill !== null) {
      kill.takenAgainBy = workers
        .filter((w) => w.options.name !== kill.worker)
        .filter((w) => jobsInLog(w.lines, 'took').includes(kill.remoteJobId))
        .map((w) => w.options.name);
      kill.finishedBy = workers
        .filter((w) => jobsInLog(w.lines, 'finished').includes(kill.remoteJobId))
        .map((w) => w.options.name);
      if (kill.finishedBy.length !== 1) {
        problems.push(
          `job ${kill.remoteJobId} of the killed worker was finished by ${kill.finishedBy.length} workers, not 1`,
        );
      }
    }
    const access = await workerTokenAccess(client, dataDir, recordingIds[0], dataSource);
    const report: ScaleReport = {
      sizes: describeSizes(options.sizes),
      recordings: recordingIds.length,
      workers: options.workers,
      concurrency: options.concurrency,
      uploadS,
      computeS,
      wallS: (performance.now() - started) / 1000,
      loadAverage: { before: loadBefore, after: loadavg() },
      states: await countStates(dataSource),
      jobsByWorker: Object.fromEntries(
        workers.map((w) => [
          w.options.name + (w.running ? '' : ' (killed)'),
          {
            took: jobsInLog(w.lines, 'took').length,
            finished: jobsInLog(w.lines, 'finished').length,
          },
        ]),
      ),
      kill,
      access,
      problems,
      dataDir,
    };
    if (problems.length > 0) keep = true;
    return report;
  } catch (error) {
    keep = true;
    throw error;
  } finally {
    await Promise.all(workers.map((w) => w.stop('SIGTERM')));
    if (dataSource?.isInitialized) await dataSource.destroy();
    if (server !== null) await stopServer(server, 'SIGTERM');
    await redis.stop();
    if (!keep) rmSync(dataDir, { recursive: true, force: true });
  }
}

/** SIGKILL `worker` as soon as it takes a job; start a worker of the same name again. */
async function killAndRestart(
  worker: WorkerProcess,
  startWorker: (name: string) => WorkerProcess,
  log: (line: string) => void,
): Promise<KillRecord> {
  const line = await worker.waitForLine((l) => l.includes(': took job '), 120_000);
  await worker.stop('SIGKILL');
  const remoteJobId = jobsInLog([line], 'took')[0];
  log(`killed ${worker.options.name} (pid ${worker.pid}) holding job ${remoteJobId}`);
  await sleep(1000);
  const again = startWorker(`${worker.options.name}-restarted`);
  await again.waitForLine((l) => l.includes(': ready:'), 30_000);
  return { worker: worker.options.name, remoteJobId, takenAgainBy: [], finishedBy: [] };
}

async function unsettled(dataSource: DataSource): Promise<number> {
  const [row] = (await dataSource.query(
    `SELECT (SELECT count(*) FROM "recording" WHERE "state" IN ('received','validating','queued','computing'))
          + (SELECT count(*) FROM "job" WHERE "state" IN ('queued','running')) AS n`,
  )) as Array<{ n: number }>;
  return Number(row.n);
}

async function countStates(dataSource: DataSource): Promise<Record<string, number>> {
  const rows = (await dataSource.query(
    `SELECT "state", count(*) AS n FROM "recording" GROUP BY "state"`,
  )) as Array<{ state: string; n: number }>;
  return Object.fromEntries(rows.map((r) => [r.state, Number(r.n)]));
}

/**
 * Every recording ready with one run, one `compute` and one `ready` audit entry, no failed
 * attempt, one job done at its first attempt; each task run followed its visit's resting IAF.
 */
async function exactlyOnce(dataSource: DataSource, recordingIds: string[]): Promise<string[]> {
  const problems: string[] = [];
  for (const id of recordingIds) {
    const [recording] = (await dataSource.query(
      `SELECT "state", "kind", "visitId" FROM "recording" WHERE "id" = ?`,
      [id],
    )) as Array<{ state: string; kind: string; visitId: string }>;
    if (recording.state !== 'ready') problems.push(`recording ${id} is ${recording.state}`);
    const runs = (await dataSource.query(
      `SELECT "id", "iafHz", "pafHz", "cogHz" FROM "analysis_run" WHERE "recordingId" = ?`,
      [id],
    )) as Array<{ id: string; iafHz: number | null; pafHz: number | null; cogHz: number | null }>;
    if (runs.length !== 1) problems.push(`recording ${id} has ${runs.length} runs, not 1`);
    const audit = (await dataSource.query(
      `SELECT "action", count(*) AS n FROM "audit_entry"
        WHERE "objectType" = 'Recording' AND "objectId" = ? GROUP BY "action"`,
      [id],
    )) as Array<{ action: string; n: number }>;
    const actions = Object.fromEntries(audit.map((a) => [a.action, Number(a.n)]));
    for (const action of ['compute', 'ready']) {
      if ((actions[action] ?? 0) !== 1) {
        problems.push(
          `recording ${id} has ${actions[action] ?? 0} "${action}" audit entries, not 1`,
        );
      }
    }
    if ((actions['attempt-failed'] ?? 0) > 0) problems.push(`recording ${id} had a failed attempt`);
    const jobs = (await dataSource.query(
      `SELECT "state", "attempts" FROM "job" WHERE "subjectId" = ?`,
      [id],
    )) as Array<{ state: string; attempts: number }>;
    if (jobs.length !== 1 || jobs[0].state !== 'done' || Number(jobs[0].attempts) !== 1) {
      problems.push(`recording ${id} has jobs ${JSON.stringify(jobs)}, not one done at attempt 1`);
    }
    if (recording.kind === 'task' && runs.length === 1) {
      const [rest] = (await dataSource.query(
        `SELECT r."pafHz", r."cogHz" FROM "analysis_run" r JOIN "recording" c ON c."latestRunId" = r."id"
          WHERE c."visitId" = ? AND c."kind" = 'resting'`,
        [recording.visitId],
      )) as Array<{ pafHz: number | null; cogHz: number | null }>;
      const iaf = rest === undefined ? null : (rest.pafHz ?? rest.cogHz);
      if (runs[0].iafHz !== iaf) {
        problems.push(
          `task recording ${id} used IAF ${runs[0].iafHz}, its visit's rest gave ${iaf}`,
        );
      }
    }
  }
  return problems;
}

/** What the local worker token gets from user routes, and a user from the worker API. */
async function workerTokenAccess(
  client: GyreClient,
  dataDir: string,
  recordingId: string,
  dataSource: DataSource,
): Promise<Record<string, number>> {
  const token = readFileSync(join(dataDir, 'worker-token'), 'utf8').trim();
  const asWorker = async (path: string): Promise<number> =>
    (await fetch(`${client.url}${path}`, { headers: { Authorization: `Bearer ${token}` } })).status;
  const [job] = (await dataSource.query(`SELECT "id" FROM "job" LIMIT 1`)) as Array<{ id: string }>;
  return {
    'worker GET /api/participants': await asWorker('/api/participants'),
    'worker GET /api/recordings/:id/results': await asWorker(
      `/api/recordings/${recordingId}/results`,
    ),
    'worker GET /api/recordings/:id/file': await asWorker(`/api/recordings/${recordingId}/file`),
    'worker GET /api/worker-tokens': await asWorker('/api/worker-tokens'),
    'worker GET /api/auth/me': await asWorker('/api/auth/me'),
    'technician GET /api/worker/jobs/:id/1/input': (
      await client.call('GET', `/api/worker/jobs/${job.id}/1/input`, 'technician')
    ).status,
  };
}

async function waitUntil(condition: () => Promise<boolean>, timeoutMs: number): Promise<boolean> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (await condition()) return true;
    await sleep(250);
  }
  return false;
}
