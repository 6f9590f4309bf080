/**
 * The worker API on a real redis-server (started here on a free port, append-only on) and the
 * real application with REDIS_URL: this test plays the worker by hand — it reads the local
 * worker token from the data folder, fetches an attempt's input and file, computes it with
 * the server's own worker-thread pool, and posts results good, bad, repeated and late. Then
 * the server is restarted (jobs in Redis stay in flight), Redis is restarted (its append-only
 * file keeps the job) and emptied (the server hands the attempt over again), and a worker that
 * finishes without posting makes the attempt count as failed.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { getDataSourceToken } from '@nestjs/typeorm';
import { Queue, Worker } from 'bullmq';
import type { Redis } from 'ioredis';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createApp } from '../src/app.factory';
import { WorkerPoolService } from '../src/jobs/worker-pool.service';
import type { AnalyzeOutcome } from '../src/jobs/worker/worker-tasks';
import {
  ANALYSIS_QUEUE,
  analyzeTaskOf,
  openRedis,
  RemoteTask,
} from '../src/remote-workers/remote-job';
import { RedisServer, startRedisServer } from '../src/remote-workers/redis-server-process';
import {
  encodeResultBody,
  float64ToBase64,
  RESULT_CONTENT_TYPE,
} from '../src/remote-workers/result-wire';
import { GYRE_VERSION } from '../src/version';
import { binaryBody } from './helpers/binary-body';
import { startTestApp, TEST_JWT_SECRET, TEST_PUBLIC_URL, TestApp } from './helpers/test-app';
import { syntheticRestEdf, upload } from './recordings-fixtures';

interface JobRow {
  id: string;
  state: string;
  attempts: number;
}

let redis: RedisServer;
let t: TestApp;
let app: NestExpressApplication;
let url: string;
let dataSource: DataSource;
let client: Redis;
let bull: Queue;
let pool: WorkerPoolService;
const scratch = mkdtempSync(join(tmpdir(), 'gyre-worker-api-'));

const env = (redisUrl: string): Record<string, string> => ({
  REDIS_URL: redisUrl,
  REMOTE_CHECK_INTERVAL_MS: '300',
});

function workerToken(): string {
  return readFileSync(join(t.dataDir, 'worker-token'), 'utf8').trim();
}

function asWorker(method: 'get' | 'post', path: string): request.Test {
  return request(url)
    [method](`/api/worker/jobs/${path}`)
    .set('Authorization', `Bearer ${workerToken()}`);
}

async function jobOf(recordingId: string): Promise<JobRow> {
  const rows = (await dataSource.query(
    `SELECT "id", "state", "attempts" FROM "job" WHERE "subjectId" = ? ORDER BY "createdAt" DESC`,
    [recordingId],
  )) as JobRow[];
  return { ...rows[0], attempts: Number(rows[0].attempts) };
}

async function waitFor<T>(
  what: string,
  probe: () => Promise<T | null>,
  timeoutMs = 20_000,
): Promise<T> {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const value = await probe();
    if (value !== null) return value;
    await new Promise((done) => setTimeout(done, 100));
  }
  throw new Error(`timed out waiting for ${what}`);
}

async function count(sql: string, params: unknown[]): Promise<number> {
  const [row] = (await dataSource.query(sql, params)) as Array<{ n: number }>;
  return Number(row.n);
}

const runsOf = (recordingId: string): Promise<number> =>
  count(`SELECT count(*) AS n FROM "analysis_run" WHERE "recordingId" = ?`, [recordingId]);
const auditOf = (recordingId: string, action: string): Promise<number> =>
  count(
    `SELECT count(*) AS n FROM "audit_entry" WHERE "objectType" = 'Recording' AND "objectId" = ? AND "action" = ?`,
    [recordingId, action],
  );

/** What a worker does between fetching the input and posting: the server's own computation. */
async function compute(task: RemoteTask, file: Buffer): Promise<AnalyzeOutcome> {
  const filePath = join(scratch, `${task.jobId}.${task.attempt}.edf`);
  writeFileSync(filePath, file);
  return pool.analyze(analyzeTaskOf(task, filePath), () => undefined);
}

function postResult(ref: string, body: unknown): request.Test {
  return asWorker('post', `${ref}/result`)
    .set('Content-Type', RESULT_CONTENT_TYPE)
    .send(JSON.stringify(body));
}

beforeAll(async () => {
  redis = await startRedisServer({ appendOnly: true });
  t = await startTestApp({ env: env(redis.url) });
  app = t.app;
  url = t.url;
  dataSource = t.dataSource;
  client = openRedis(redis.url);
  bull = new Queue(ANALYSIS_QUEUE, { connection: client });
  pool = new WorkerPoolService();
}, 60_000);

afterAll(async () => {
  await bull?.close();
  await client?.quit();
  await pool?.onModuleDestroy();
  await app?.close();
  await redis?.dispose();
  // Restarted on the first one's folder, which dispose() leaves to its owner: this test.
  if (redis !== undefined) rmSync(redis.dir, { recursive: true, force: true });
  rmSync(t.dataDir, { recursive: true, force: true });
  rmSync(scratch, { recursive: true, force: true });
});

describe('the worker API with REDIS_URL', () => {
  let recordingId: string;
  let job: JobRow;
  let task: RemoteTask;
  let outcome: AnalyzeOutcome;

  it('hands an accepted upload to BullMQ as <job>.<attempt> and computes nothing itself', async () => {
    const response = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'resting',
      bytes: syntheticRestEdf({ peakHz: 9.5 }),
    });
    expect(response.status).toBe(201);
    recordingId = (response.body as { id: string }).id;
    job = await waitFor('the job to run', async () => {
      const row = await jobOf(recordingId);
      return row.state === 'running' ? row : null;
    });
    const remote = await waitFor(
      'the BullMQ job',
      async () => (await bull.getJob(`${job.id}.1`)) ?? null,
    );
    expect(await remote.getState()).toBe('waiting');
    // Nobody computes it: still computing, no run, a second later.
    await new Promise((done) => setTimeout(done, 1000));
    expect(await runsOf(recordingId)).toBe(0);
    const recording = await request(url)
      .get(`/api/recordings/${recordingId}`)
      .set(await t.authHeader('technician'));
    expect(recording.body.state).toBe('computing');
  });

  it('serves the input and the stored file of the current attempt to a worker token only', async () => {
    const input = await asWorker('get', `${job.id}/1/input`);
    expect(input.status).toBe(200);
    task = input.body as RemoteTask;
    expect(task).toMatchObject({
      jobId: job.id,
      attempt: 1,
      recordingId,
      kind: 'resting',
      gyreVersion: GYRE_VERSION,
    });
    const file = await asWorker('get', `${job.id}/1/file`).buffer(true).parse(binaryBody);
    expect(file.status).toBe(200);
    const bytes = file.body as Buffer;
    // SHA-256 (FIPS 180-4) of what was served is the checksum the task names.
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(task.checksumSha256);
    expect(file.headers['x-gyre-sha256']).toBe(task.checksumSha256);
    expect(bytes.length).toBe(task.fileBytes);
    outcome = await compute(task, bytes);

    const technician = await request(url)
      .get(`/api/worker/jobs/${job.id}/1/input`)
      .set(await t.authHeader('technician'));
    expect(technician.status).toBe(403);
    const anonymous = await request(url).get(`/api/worker/jobs/${job.id}/1/input`);
    expect(anonymous.status).toBe(401);
    for (const path of [
      '/api/participants',
      `/api/recordings/${recordingId}/results`,
      '/api/users',
    ]) {
      const refused = await request(url).get(path).set('Authorization', `Bearer ${workerToken()}`);
      expect([path, refused.status]).toEqual([path, 403]);
    }
  }, 60_000);

  it('answers 400 naming what is wrong with a result, 422 for another version, and stores nothing', async () => {
    const good = encodeResultBody(outcome, GYRE_VERSION);
    const cases: Array<[unknown, string]> = [
      [{ ...good, summary: { ...good.summary, bandHz: 'alpha' } }, 'summary.bandHz'],
      [
        {
          ...good,
          summary: { ...good.summary, quality: { ...good.summary.quality, durationS: null } },
        },
        'summary.quality.durationS',
      ],
      [{ ...good, summary: { ...good.summary, extra: 1 } }, 'summary.extra'],
      [
        { ...good, series: { ...good.series, 'rest:frequencyHz': 'not base64!' } },
        'series.rest:frequencyHz: is not base64',
      ],
      // One value short of the spectrum: 8 bytes fewer (IEEE 754 binary64 values are 8 bytes).
      [
        {
          ...good,
          series: { ...good.series, 'rest:powerUv2PerHz': float64ToBase64(new Float64Array(3)) },
        },
        'series.rest:powerUv2PerHz: 3 values',
      ],
      [{ ...good, series: { 'rest:frequencyHz': 'AAAA' } }, 'whole number of 8-byte values'],
      [[1, 2], 'the body must be a JSON object'],
    ];
    for (const [body, named] of cases) {
      const response = await postResult(`${job.id}/1`, body);
      expect([named, response.status]).toEqual([named, 400]);
      expect(response.body.code).toBe('WORKER_RESULT_INVALID');
      expect(response.body.message).toContain(named);
    }
    const malformed = await asWorker('post', `${job.id}/1/result`)
      .set('Content-Type', RESULT_CONTENT_TYPE)
      .send('{"summary":');
    expect(malformed.status).toBe(400);
    const otherVersion = await postResult(`${job.id}/1`, { ...good, gyreVersion: '0.0.0-other' });
    expect(otherVersion.status).toBe(422);
    expect(otherVersion.body.code).toBe('WORKER_VERSION_MISMATCH');
    const badParams = await asWorker('post', `${job.id}/one/result`)
      .set('Content-Type', RESULT_CONTENT_TYPE)
      .send('{}');
    expect(badParams.status).toBe(400);
    const unknownJob = await postResult(`00000000-0000-4000-8000-000000000000/1`, good);
    expect(unknownJob.status).toBe(404);
    const laterAttempt = await postResult(`${job.id}/2`, good);
    expect(laterAttempt.status).toBe(409);
    expect(await runsOf(recordingId)).toBe(0);
    expect((await jobOf(recordingId)).state).toBe('running');
  });

  it('stores the same result posted twice at once exactly once', async () => {
    const body = encodeResultBody(outcome, GYRE_VERSION);
    const answers = await Promise.all([
      postResult(`${job.id}/1`, body),
      postResult(`${job.id}/1`, body),
    ]);
    expect(answers.map((a) => a.status)).toEqual([200, 200]);
    const duplicates = answers.map((a) => a.body.duplicate as boolean).sort();
    expect(duplicates).toEqual([false, true]);
    expect(answers[0].body.runId).toBe(answers[1].body.runId);
    const again = await postResult(`${job.id}/1`, body);
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ runId: answers[0].body.runId, duplicate: true });
    expect(await runsOf(recordingId)).toBe(1);
    expect(await auditOf(recordingId, 'ready')).toBe(1);
    expect(await auditOf(recordingId, 'compute')).toBe(1);
    expect(await jobOf(recordingId)).toMatchObject({ state: 'done', attempts: 1 });
    // The stored numbers are the posted ones: PAF as the worker computed it, to the last bit.
    const results = await request(url)
      .get(`/api/recordings/${recordingId}/results`)
      .set(await t.authHeader('analyst'));
    expect(results.status).toBe(200);
    expect(results.body.rest.pafHz).toBe(outcome.summary.rest?.pafHz);
    // Late answers about a finished attempt: progress and failure are refused, nothing changes.
    const progress = await asWorker('post', `${job.id}/1/progress`).send({ percent: 50 });
    expect(progress.status).toBe(409);
    const failure = await asWorker('post', `${job.id}/1/failure`).send({ message: 'late' });
    expect(failure.status).toBe(409);
    expect(await auditOf(recordingId, 'attempt-failed')).toBe(0);
  });
});

describe('restarts and losses with REDIS_URL', () => {
  let recordingId: string;
  let job: JobRow;

  it('counts a reported failure as an attempt and dispatches the next one', async () => {
    const response = await upload(t, 'technicianA2', t.seed.visits.A2.id, {
      kind: 'resting',
      bytes: syntheticRestEdf({ peakHz: 10.5, seed: 11 }),
    });
    expect(response.status).toBe(201);
    recordingId = (response.body as { id: string }).id;
    job = await waitFor('the job to run', async () => {
      const row = await jobOf(recordingId);
      return row.state === 'running' ? row : null;
    });
    const failed = await asWorker('post', `${job.id}/1/failure`).send({ message: 'out of memory' });
    expect(failed.status).toBe(200);
    expect(await auditOf(recordingId, 'attempt-failed')).toBe(1);
    await waitFor('attempt 2 in Redis', async () => (await bull.getJob(`${job.id}.2`)) ?? null);
    expect(await jobOf(recordingId)).toMatchObject({ state: 'running', attempts: 2 });
    const stale = await asWorker('get', `${job.id}/1/input`);
    expect(stale.status).toBe(409);
  });

  it('keeps a job in flight across a server restart when BullMQ still has it', async () => {
    await app.close();
    app = await createApp({
      env: {
        NODE_ENV: 'test',
        DATA_DIR: t.dataDir,
        JWT_SECRET: TEST_JWT_SECRET,
        PUBLIC_URL: TEST_PUBLIC_URL,
        LOG_LEVEL: 'error',
        ...env(redis.url),
      },
    });
    await app.listen(0, '127.0.0.1');
    url = `http://127.0.0.1:${(app.getHttpServer().address() as { port: number }).port}`;
    dataSource = app.get<DataSource>(getDataSourceToken());
    expect(await jobOf(recordingId)).toMatchObject({ state: 'running', attempts: 2 });
    expect(await auditOf(recordingId, 'attempt-failed')).toBe(1);
    const input = await asWorker('get', `${job.id}/2/input`);
    expect(input.status).toBe(200);
  });

  it('finds the job again after Redis restarts from its append-only file', async () => {
    // SIGTERM: Redis writes its append-only file before it exits (appendonly yes).
    await redis.stop('SIGTERM');
    redis = await startRedisServer({ appendOnly: true, dir: redis.dir, port: redis.port });
    const remote = await waitFor(
      'the job after the Redis restart',
      async () => (await bull.getJob(`${job.id}.2`)) ?? null,
    );
    expect(await remote.getState()).toBe('waiting');
    expect((await asWorker('get', `${job.id}/2/input`)).status).toBe(200);
  });

  it('hands the attempt over again when Redis lost it', async () => {
    await client.flushall();
    expect(await bull.getJob(`${job.id}.2`)).toBeUndefined();
    const again = await waitFor(
      'the attempt handed over again',
      async () => (await bull.getJob(`${job.id}.2`)) ?? null,
    );
    expect(again.data.attempt).toBe(2);
    expect(await jobOf(recordingId)).toMatchObject({ state: 'running', attempts: 2 });
    expect(await auditOf(recordingId, 'attempt-failed')).toBe(1);
  });

  it('fails the attempt when a worker finishes the BullMQ job without a result', async () => {
    const silent = new Worker(ANALYSIS_QUEUE, async () => 'nothing posted', {
      connection: client,
      concurrency: 1,
    });
    try {
      await waitFor('attempt 3', async () => {
        const row = await jobOf(recordingId);
        return row.attempts === 3 || row.state === 'failed' ? row : null;
      });
    } finally {
      await silent.close();
    }
    expect(await auditOf(recordingId, 'attempt-failed')).toBe(2);
    const [row] = (await dataSource.query(
      `SELECT "failureMessage" FROM "recording" WHERE "id" = ?`,
      [recordingId],
    )) as Array<{ failureMessage: string }>;
    expect(row.failureMessage).toContain('without delivering a result');
  });
});

describe('without REDIS_URL', () => {
  it('has no jobs for workers: the worker API answers 404 and the server computes in-process', async () => {
    const local = await startTestApp();
    try {
      const token = readFileSync(join(local.dataDir, 'worker-token'), 'utf8').trim();
      const response = await request(local.url)
        .get('/api/worker/jobs/00000000-0000-4000-8000-000000000000/1/input')
        .set('Authorization', `Bearer ${token}`);
      expect(response.status).toBe(404);
      expect(response.body.code).toBe('WORKER_API_NOT_REMOTE');
    } finally {
      await local.close();
    }
  });
});
