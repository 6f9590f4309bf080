import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

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
