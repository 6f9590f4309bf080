/**
 * The built server (dist/, compiled worker file) as a child process: killed with SIGKILL
 * while a job computes, restarted on the same DATA_DIR, the job completes. The server is
 * started by the same `createApp` as dist/main.js, but bound to 127.0.0.1 (main.js binds
 * every interface). Recordings are generated (see recordings-fixtures.ts).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type { RecordingView } from '@gyre/shared';
import { sqliteOptions } from '../src/database/database-options';
import {
  ServerProcess,
  sleep,
  startServer,
  stopServer,
} from '../src/robustness/crash/server-process';
import { Seed, SEED_PASSWORD, seedDatabase } from './helpers/seed';
import { INVENTED_PATIENT_NAME, syntheticTaskEdf } from './recordings-fixtures';

const BACKEND = resolve(__dirname, '..');
const REPO = resolve(BACKEND, '..');
const JWT_SECRET = 'gyre-restart-test-secret-0123456789abcdefghijkl';
/** Generous: under `npm test` another jest worker may hold the other core meanwhile. */
const START_TIMEOUT_MS = 90_000;

describe('a server killed mid-job', () => {
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-restart-'));
  const logDir = mkdtempSync(join(tmpdir(), 'gyre-restart-log-'));
  const logFile = join(logDir, 'server.log');
  const start = (): Promise<ServerProcess> =>
    startServer(dataDir, JWT_SECRET, logFile, START_TIMEOUT_MS, { LOG_LEVEL: 'verbose' });
  let server: ServerProcess | null = null;
  let seed: Seed;

  beforeAll(() => {
    execFileSync('npm', ['run', 'build', '-w', 'shared'], { cwd: REPO, stdio: 'ignore' });
    execFileSync('npx', ['tsc', '-p', 'backend/tsconfig.build.json'], {
      cwd: REPO,
      stdio: 'inherit',
    });
  }, 180_000);

  afterAll(async () => {
    if (server !== null) await stopServer(server, 'SIGTERM');
    rmSync(dataDir, { recursive: true, force: true });
    rmSync(logDir, { recursive: true, force: true });
  });

  it('uses the compiled worker file from dist/', () => {
    expect(existsSync(join(BACKEND, 'dist/jobs/worker/analysis.worker.js'))).toBe(true);
  });

  it('picks the job up again after SIGKILL and completes it on the second attempt', async () => {
    server = await start();
    const dataSource = new DataSource({
      ...sqliteOptions(join(dataDir, 'gyre.sqlite')),
      migrationsRun: false,
    });
    await dataSource.initialize();
    seed = await seedDatabase(dataSource);
    const signIn = await request(server.url)
      .post('/api/auth/sign-in')
      .send({ email: seed.users.technician.email, password: SEED_PASSWORD });
    expect(signIn.status).toBe(200);
    const auth = {
      Authorization: `Bearer ${(signIn.body as { accessToken: string }).accessToken}`,
    };

    // Generated: 20 minutes, 4 channels at 256 Hz, so that the computation takes seconds.
    const bytes = syntheticTaskEdf({ durationS: 1200, seed: 21 });
    const uploaded = await request(server.url)
      .post(`/api/visits/${seed.visits.A1.id}/recordings`)
      .set(auth)
      .field('kind', 'task')
      .attach('file', Buffer.from(bytes), 'long.edf');
    expect(uploaded.status).toBe(201);
    const id = (uploaded.body as RecordingView).id;

    let seen: RecordingView | null = null;
    const until = Date.now() + 30_000;
    while (Date.now() < until) {
      seen = (await request(server.url).get(`/api/recordings/${id}`).set(auth))
        .body as RecordingView;
      if (seen.state !== 'queued') break;
      await sleep(50);
    }
    expect(seen?.state).toBe('computing');
    await sleep(300);
    await stopServer(server, 'SIGKILL');
    server = null;

    const [stuck] = (await dataSource.query(
      `SELECT "state", "attempts" FROM "job" WHERE "subjectId" = ?`,
      [id],
    )) as Array<{
      state: string;
      attempts: number;
    }>;
    expect(stuck).toEqual({ state: 'running', attempts: 1 });
    expect(await dataSource.query(`SELECT count(*) AS n FROM "analysis_run"`)).toEqual([{ n: 0 }]);

    server = await start();
    let done: RecordingView | null = null;
    const deadline = Date.now() + 120_000;
    while (Date.now() < deadline) {
      done = (await request(server.url).get(`/api/recordings/${id}`).set(auth))
        .body as RecordingView;
      if (done.state === 'ready' || done.state === 'failed') break;
      await sleep(250);
    }
    expect(done?.state).toBe('ready');
    expect(done?.latestJob).toMatchObject({ state: 'done', attempts: 2, progressPercent: 100 });
    expect(done?.latestJob?.error).toBeNull();
    const runs = (await dataSource.query(
      `SELECT "inputChecksumSha256", "roiDeltaFHz" FROM "analysis_run"`,
    )) as Array<{
      inputChecksumSha256: string;
      roiDeltaFHz: number;
    }>;
    expect(runs).toHaveLength(1);
    expect(runs[0].inputChecksumSha256).toBe(done?.checksumSha256);
    // Generated truth: a 0.6 Hz dip after each onset.
    expect(runs[0].roiDeltaFHz).toBeCloseTo(-0.6, 1);
    await dataSource.destroy();

    await stopServer(server, 'SIGTERM');
    server = null;
    // The invented patient name never reached the stored copy, the database or the logs.
    const needle = Buffer.from(INVENTED_PATIENT_NAME);
    const stored = readFileSync(join(dataDir, 'uploads', `${done?.checksumSha256}.edf`));
    expect(stored.includes(needle)).toBe(false);
    for (const file of readdirSync(dataDir).filter((f) => f.startsWith('gyre.sqlite'))) {
      expect(readFileSync(join(dataDir, file)).includes(needle)).toBe(false);
    }
    const output = readFileSync(logFile, 'utf8');
    expect(output).toContain(`/api/recordings/${id}`); // the logs were captured (verbose level)
    expect(output.includes(INVENTED_PATIENT_NAME)).toBe(false);
  }, 240_000);
});
