/**
 * The settings of `npm run worker`: command-line options over environment variables over
 * defaults, each checked with a message naming the option and the variable.
 */
import { availableParallelism, hostname } from 'node:os';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';

export interface WorkerSettings {
  redisUrl: string;
  serverUrl: string;
  /** A fixed token (GYRE_WORKER_TOKEN), or the file the server writes at each start. */
  token: { kind: 'value'; value: string } | { kind: 'file'; path: string };
  /** Jobs computed at once by this process. */
  concurrency: number;
  /** BullMQ: a job whose lock is not renewed for this long is stalled and taken again, ms. */
  lockMs: number;
  /** BullMQ: how often this worker looks for stalled jobs, ms. */
  stalledIntervalMs: number;
  /** BullMQ: a job stalled more often than this fails (then the server counts an attempt). */
  maxStalled: number;
  /** How this worker names itself in logs and in BullMQ. */
  name: string;
}

export const WORKER_USAGE = `Usage: npm run worker -- [options]

Takes Gyre's computations from Redis, fetches each recording from the server, computes it
and posts the result back (docs/scale-out.md).

Options (each over its environment variable):
  --redis URL          REDIS_URL                 the Redis the server uses (required)
  --server URL         GYRE_SERVER_URL           the Gyre server (default http://127.0.0.1:3000)
  --token TOKEN        GYRE_WORKER_TOKEN         a worker token made in Team › Worker tokens
  --data-dir DIR       GYRE_DATA_DIR, DATA_DIR   on the server's machine: read DIR/worker-token
                                                 instead (default ./data)
  --concurrency N      GYRE_WORKER_CONCURRENCY   jobs at once (default: the number of cores)
  --name NAME          GYRE_WORKER_NAME          name in logs (default host:pid)
  --help
Stalled-job recovery: GYRE_WORKER_LOCK_MS (30000), GYRE_WORKER_STALLED_INTERVAL_MS (30000),
GYRE_WORKER_MAX_STALLED (1).`;

export class WorkerSettingsError extends Error {}

export function workerSettings(
  argv: readonly string[],
  env: Record<string, string | undefined>,
): WorkerSettings | 'help' {
  const { values } = parseArgs({
    args: [...argv],
    options: {
      redis: { type: 'string' },
      server: { type: 'string' },
      token: { type: 'string' },
      'data-dir': { type: 'string' },
      concurrency: { type: 'string' },
      name: { type: 'string' },
      help: { type: 'boolean' },
    },
    strict: true,
    allowPositionals: false,
  });
  if (values.help === true) return 'help';
  const pick = (option: string | undefined, ...names: string[]): string | undefined =>
    option ?? names.map((name) => env[name]).find((value) => value !== undefined && value !== '');
  const redisUrl = pick(values.redis, 'REDIS_URL');
  if (redisUrl === undefined) {
    throw new WorkerSettingsError('--redis / REDIS_URL: the Redis URL the server uses is required');
  }
  if (!/^rediss?:\/\//.test(redisUrl)) {
    throw new WorkerSettingsError(`--redis / REDIS_URL: ${redisUrl} is not a redis:// URL`);
  }
  const serverUrl = (pick(values.server, 'GYRE_SERVER_URL') ?? 'http://127.0.0.1:3000').replace(
    /\/+$/,
    '',
  );
  if (!/^https?:\/\/[^/]+/.test(serverUrl)) {
    throw new WorkerSettingsError(`--server / GYRE_SERVER_URL: ${serverUrl} is not an http(s) URL`);
  }
  const tokenValue = pick(values.token, 'GYRE_WORKER_TOKEN');
  const dataDir = pick(values['data-dir'], 'GYRE_DATA_DIR', 'DATA_DIR') ?? './data';
  return {
    redisUrl,
    serverUrl,
    token:
      tokenValue !== undefined
        ? { kind: 'value', value: tokenValue.trim() }
        : { kind: 'file', path: join(resolve(dataDir), 'worker-token') },
    concurrency: integer(
      pick(values.concurrency, 'GYRE_WORKER_CONCURRENCY'),
      availableParallelism(),
      '--concurrency / GYRE_WORKER_CONCURRENCY',
      1,
      256,
    ),
    lockMs: integer(env.GYRE_WORKER_LOCK_MS, 30_000, 'GYRE_WORKER_LOCK_MS', 500, 3_600_000),
    stalledIntervalMs: integer(
      env.GYRE_WORKER_STALLED_INTERVAL_MS,
      30_000,
      'GYRE_WORKER_STALLED_INTERVAL_MS',
      200,
      3_600_000,
    ),
    maxStalled: integer(env.GYRE_WORKER_MAX_STALLED, 1, 'GYRE_WORKER_MAX_STALLED', 0, 100),
    name: pick(values.name, 'GYRE_WORKER_NAME') ?? `${hostname()}:${process.pid}`,
  };
}

function integer(
  raw: string | undefined,
  fallback: number,
  name: string,
  min: number,
  max: number,
): number {
  if (raw === undefined || raw === '') return fallback;
  if (!/^\d+$/.test(raw.trim()))
    throw new WorkerSettingsError(`${name}: ${raw} is not a whole number`);
  const value = Number(raw);
  if (value < min || value > max) {
    throw new WorkerSettingsError(`${name}: ${value} is outside ${min}–${max}`);
  }
  return value;
}
