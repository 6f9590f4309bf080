import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { makeDataDirPrivate } from './data-dir-permissions';
import { EnvironmentError, EnvironmentVariables, NodeEnv } from './environment';
import { parseTrustProxy, TrustProxy } from './trust-proxy';

export interface AppConfig {
  nodeEnv: NodeEnv;
  port: number;
  /** The address to listen on: loopback unless HOST says otherwise (e.g. 0.0.0.0). */
  host: string;
  /** Everything Gyre writes lives here: database, uploads, secrets, mail. */
  dataDir: string;
  databaseFile: string;
  uploadsDir: string;
  mailDir: string;
  jwtSecret: string;
  /** Where the generated secret came from, for the start-up message. */
  jwtSecretSource: 'environment' | 'generated' | 'data-dir';
  smtpUrl: string | null;
  publicUrl: string;
  /** The largest recording accepted, in bytes (inclusive). */
  uploadMaxBytes: number;
  /** Bulk upload: most manifest rows, and most bytes of all its files together. */
  bulkUploadMaxRows: number;
  bulkUploadMaxBytes: number;
  logLevel: string;
  /** Express's `trust proxy`: false (the default) believes no X-Forwarded-For at all. */
  trustProxy: TrustProxy;
  /** Null: computations run in this process; set: see {@link RemoteConfig}. */
  remote: RemoteConfig | null;
  /** The largest analysis result a remote worker may post, in bytes. */
  workerResultMaxBytes: number;
}

/** Computations on BullMQ and Redis, by remote workers (docs/scale-out.md). */
export interface RemoteConfig {
  redisUrl: string;
  /** Jobs handed to Redis and not yet finished, at most: the rest wait in SQLite, `queued`. */
  dispatchLimit: number;
  /** How often running jobs are compared with Redis (lost or failed ones are settled), ms. */
  checkIntervalMs: number;
}

const DEFAULT_UPLOAD_MAX_BYTES = 2 * 1024 ** 3;
// A study day's worth of visits at a site; the bytes stay within one request's patience.
const DEFAULT_BULK_UPLOAD_MAX_ROWS = 200;
const DEFAULT_BULK_UPLOAD_MAX_BYTES = 8 * 1024 ** 3;
// Enough for every worker of a few machines to hold one job and have the next one waiting;
// more would only show recordings as `computing` while they wait in Redis.
const DEFAULT_REMOTE_DISPATCH_LIMIT = 32;
const DEFAULT_REMOTE_CHECK_INTERVAL_MS = 30_000;
// A 60-minute task recording's curves and raster are a few MB; this leaves a wide margin.
const DEFAULT_WORKER_RESULT_MAX_BYTES = 256 * 1024 ** 2;
const PLACEHOLDER_SECRETS = ['secret', 'changeme', 'change-me', 'jwt-secret', 'password', 'test'];

/** Resolves validated variables into Gyre's configuration, creating the data folder. */
export function buildAppConfig(env: EnvironmentVariables): AppConfig {
  const nodeEnv = env.NODE_ENV ?? 'development';
  const port = env.PORT ?? 3000;
  const dataDir = resolve(env.DATA_DIR ?? './data');
  // Before anything is written: the database, uploads, secrets and mail are the owner's only.
  makeDataDirPrivate(dataDir);
  const { secret, source } = resolveJwtSecret(env.JWT_SECRET, dataDir, nodeEnv);
  return {
    nodeEnv,
    port,
    host: env.HOST ?? '127.0.0.1',
    dataDir,
    databaseFile: join(dataDir, 'gyre.sqlite'),
    uploadsDir: join(dataDir, 'uploads'),
    mailDir: join(dataDir, 'mail'),
    jwtSecret: secret,
    jwtSecretSource: source,
    smtpUrl: env.SMTP_URL ?? null,
    publicUrl: (env.PUBLIC_URL ?? `http://localhost:${port}`).replace(/\/+$/, ''),
    uploadMaxBytes: env.UPLOAD_MAX_BYTES ?? DEFAULT_UPLOAD_MAX_BYTES,
    bulkUploadMaxRows: env.BULK_UPLOAD_MAX_ROWS ?? DEFAULT_BULK_UPLOAD_MAX_ROWS,
    bulkUploadMaxBytes: env.BULK_UPLOAD_MAX_BYTES ?? DEFAULT_BULK_UPLOAD_MAX_BYTES,
    logLevel: env.LOG_LEVEL ?? (nodeEnv === 'test' ? 'warn' : 'log'),
    trustProxy: trustProxyOf(env.TRUST_PROXY),
    remote:
      env.REDIS_URL === undefined
        ? null
        : {
            redisUrl: env.REDIS_URL,
            dispatchLimit: env.REMOTE_DISPATCH_LIMIT ?? DEFAULT_REMOTE_DISPATCH_LIMIT,
            checkIntervalMs: env.REMOTE_CHECK_INTERVAL_MS ?? DEFAULT_REMOTE_CHECK_INTERVAL_MS,
          },
    workerResultMaxBytes: env.WORKER_RESULT_MAX_BYTES ?? DEFAULT_WORKER_RESULT_MAX_BYTES,
  };
}

function trustProxyOf(raw: string | undefined): TrustProxy {
  if (raw === undefined) return false;
  const parsed = parseTrustProxy(raw);
  if (!parsed.ok)
    throw new EnvironmentError([`TRUST_PROXY=${JSON.stringify(raw)}: ${parsed.problem}`]);
  return parsed.value;
}

function resolveJwtSecret(
  configured: string | undefined,
  dataDir: string,
  nodeEnv: NodeEnv,
): { secret: string; source: AppConfig['jwtSecretSource'] } {
  if (configured !== undefined) {
    const placeholder =
      configured.length < 32 || PLACEHOLDER_SECRETS.includes(configured.toLowerCase());
    if (placeholder && nodeEnv === 'production') {
      throw new EnvironmentError([
        'JWT_SECRET: a placeholder or short secret (under 32 characters) is refused when NODE_ENV=production',
      ]);
    }
    return { secret: configured, source: 'environment' };
  }
  const secretsDir = join(dataDir, 'secrets');
  const file = join(secretsDir, 'jwt-secret');
  if (existsSync(file)) return { secret: readFileSync(file, 'utf8').trim(), source: 'data-dir' };
  mkdirSync(secretsDir, { recursive: true, mode: 0o700 });
  const secret = randomBytes(48).toString('base64url');
  writeFileSync(file, `${secret}\n`, { mode: 0o600, flag: 'wx' });
  return { secret, source: 'generated' };
}
