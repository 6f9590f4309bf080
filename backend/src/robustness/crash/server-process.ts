/**
 * The built server (backend/dist) as a child process, started the way dist/main.js starts
 * it (`createApp`) but bound to 127.0.0.1 on a free port, as backend/test/jobs-restart does.
 * Killing it with SIGKILL is the point: no shutdown hook runs, so what survives is only what
 * the database and the file system already hold.
 */
import { ChildProcess, spawn } from 'node:child_process';
import { appendFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { resolve } from 'node:path';

/** backend/ from backend/src/robustness/crash or backend/dist/robustness/crash alike. */
export const BACKEND_DIR = resolve(__dirname, '..', '..', '..');

export interface ServerProcess {
  child: ChildProcess;
  url: string;
}

export async function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer();
    probe.once('error', fail);
    probe.listen(0, '127.0.0.1', () => {
      const port = (probe.address() as { port: number }).port;
      probe.close(() => done(port));
    });
  });
}

export function sleep(ms: number): Promise<void> {
  return new Promise((done) => setTimeout(done, ms));
}

/**
 * Starts the server on `dataDir` and resolves once `GET /api/health` answers 200 (migrations
 * and start-up recovery have run by then: Nest runs bootstrap hooks before listening).
 * Its output is appended to `logFile`.
 */
export async function startServer(
  dataDir: string,
  jwtSecret: string,
  logFile: string,
  timeoutMs = 60_000,
  /** More environment variables (e.g. REDIS_URL for the remote-worker tests). */
  extraEnv: Record<string, string> = {},
): Promise<ServerProcess> {
  const port = await freePort();
  const launcher = `require('reflect-metadata');
const { createApp } = require('./dist/app.factory');
createApp().then((app) => app.listen(${port}, '127.0.0.1')).catch((e) => { console.error(e); process.exit(1); });`;
  const child = spawn(process.execPath, ['-e', launcher], {
    cwd: BACKEND_DIR,
    env: {
      PATH: process.env.PATH,
      NODE_ENV: 'production',
      DATA_DIR: dataDir,
      JWT_SECRET: jwtSecret,
      LOG_LEVEL: 'log',
      ...extraEnv,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let exited = false;
  child.once('exit', () => (exited = true));
  const log = (chunk: Buffer): void => appendFileSync(logFile, chunk);
  child.stdout?.on('data', log);
  child.stderr?.on('data', log);
  const url = `http://127.0.0.1:${port}`;
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (exited) throw new Error(`server exited during start; see ${logFile}`);
    const status = await fetch(`${url}/api/health`)
      .then((r) => r.status)
      .catch(() => 0);
    if (status === 200) return { child, url };
    await sleep(100);
  }
  child.kill('SIGKILL');
  throw new Error(`server did not answer /api/health within ${timeoutMs} ms; see ${logFile}`);
}

export async function stopServer(server: ServerProcess, signal: NodeJS.Signals): Promise<void> {
  const { child } = server;
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise((done) => child.once('exit', done));
  child.kill(signal);
  await exited;
}
