import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import { openBrowser, type OpenBrowser } from './browser';

const REPO_ROOT = resolve(import.meta.dirname, '..', '..', '..');

export interface RunningGyre {
  baseUrl: string;
  dataDir: string;
  output: () => string;
  stop: () => Promise<void>;
}

export async function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer();
    probe.once('error', fail);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address !== null ? address.port : 0;
      probe.close(() => done(port));
    });
  });
}

/** Starts the built server (backend/dist) on a free port with a fresh data folder. */
export async function startGyre(env: Record<string, string> = {}): Promise<RunningGyre> {
  const port = await freePort();
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-e2e-'));
  let output = '';
  const child: ChildProcess = spawn(
    process.execPath,
    [join(REPO_ROOT, 'backend', 'dist', 'main.js')],
    {
      cwd: REPO_ROOT,
      env: {
        ...process.env,
        NODE_ENV: 'test',
        LOG_LEVEL: 'log',
        PORT: String(port),
        DATA_DIR: dataDir,
        ...env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`Gyre exited with ${child.exitCode}:\n${output}`);
    try {
      const response = await fetch(`${baseUrl}/api/health`);
      if (response.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`Gyre did not answer within 60 s:\n${output}`);
    await new Promise((wait) => setTimeout(wait, 250));
  }
  return {
    baseUrl,
    dataDir,
    output: () => output,
    stop: async () => {
      if (child.exitCode === null) {
        const exited = new Promise((done) => child.once('exit', done));
        child.kill('SIGTERM');
        await exited;
      }
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

export interface GyreInChromium<T> {
  /** The file's server; read it inside hooks and tests (it starts in `beforeAll`). */
  readonly gyre: RunningGyre;
  readonly browser: OpenBrowser;
  /** What `prepare` made on the fresh server (e.g. an invented study). */
  readonly prepared: T;
}

/**
 * For one test file: a fresh server and a headless Chromium, then `prepare` on the server,
 * before the file's own hooks and tests; both stopped after them. Call it once at the top of
 * the `describe`.
 */
export function gyreInChromium<T = undefined>(
  prepare?: (gyre: RunningGyre) => Promise<T>,
): GyreInChromium<T> {
  let gyre: RunningGyre | undefined;
  let browser: OpenBrowser | undefined;
  let prepared: { value: T } | undefined;
  beforeAll(async () => {
    gyre = await startGyre();
    browser = await openBrowser();
    prepared = { value: (await prepare?.(gyre)) as T };
  });
  afterAll(async () => {
    await browser?.close();
    await gyre?.stop();
  });
  const started = <V>(value: V | undefined): V => {
    if (value === undefined) throw new Error('the server and browser start in beforeAll');
    return value;
  };
  return {
    get gyre() {
      return started(gyre);
    },
    get browser() {
      return started(browser);
    },
    get prepared() {
      return started(prepared).value;
    },
  };
}
