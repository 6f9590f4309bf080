/**
 * A private redis-server for tests and the worker benchmark: Debian's /usr/bin/redis-server
 * (`.ci/run` installs it) on a free loopback port with its own folder, no snapshots, and
 * append-only persistence when asked (to restart it and find the jobs again). Not for
 * production: there Redis is the operator's (docs/scale-out.md).
 */
import { ChildProcess, spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { Socket } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort } from '../robustness/crash/server-process';

export const REDIS_SERVER = process.env.GYRE_REDIS_SERVER ?? '/usr/bin/redis-server';

export interface RedisServerOptions {
  /** Append-only file on (`appendonly yes`, fsync every second): jobs survive a restart. */
  appendOnly?: boolean;
  /** Folder for its files (kept across restarts); a new temporary one by default. */
  dir?: string;
  /** A port to reuse (after a restart); a free one by default. */
  port?: number;
}

export interface RedisServer {
  url: string;
  port: number;
  dir: string;
  child: ChildProcess;
  /** Stops it (SIGTERM, or SIGKILL to lose what is not on disk). */
  stop(signal?: NodeJS.Signals): Promise<void>;
  /** Stops it and removes its folder. */
  dispose(): Promise<void>;
}

export async function startRedisServer(options: RedisServerOptions = {}): Promise<RedisServer> {
  if (!existsSync(REDIS_SERVER)) {
    throw new Error(
      `${REDIS_SERVER} is missing: install Debian's redis-server (apt-get install redis-server; .ci/run does) or set GYRE_REDIS_SERVER`,
    );
  }
  const dir = options.dir ?? mkdtempSync(join(tmpdir(), 'gyre-redis-'));
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  const port = options.port ?? (await freePort());
  const args = [
    '--port',
    String(port),
    '--bind',
    '127.0.0.1',
    '--dir',
    dir,
    '--save',
    '',
    '--appendonly',
    options.appendOnly === true ? 'yes' : 'no',
    '--appendfsync',
    'everysec',
    // BullMQ's advice: Redis must never evict its keys.
    '--maxmemory-policy',
    'noeviction',
    '--daemonize',
    'no',
  ];
  const child = spawn(REDIS_SERVER, args, { stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  const keep = (chunk: Buffer): void => {
    output = (output + chunk.toString()).slice(-4000);
  };
  child.stdout?.on('data', keep);
  child.stderr?.on('data', keep);
  const until = Date.now() + 10_000;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`redis-server exited at start:\n${output}`);
    if (await answersPing(port)) {
      const stop = async (signal: NodeJS.Signals = 'SIGTERM'): Promise<void> => {
        if (child.exitCode !== null || child.signalCode !== null) return;
        const exited = new Promise((done) => child.once('exit', done));
        child.kill(signal);
        await exited;
      };
      return {
        url: `redis://127.0.0.1:${port}`,
        port,
        dir,
        child,
        stop,
        dispose: async () => {
          await stop();
          if (options.dir === undefined) rmSync(dir, { recursive: true, force: true });
        },
      };
    }
    await new Promise((done) => setTimeout(done, 50));
  }
  child.kill('SIGKILL');
  throw new Error(`redis-server did not answer PING on port ${port} within 10 s:\n${output}`);
}

/** RESP `PING` → `+PONG` (the Redis protocol's simplest exchange). */
function answersPing(port: number): Promise<boolean> {
  return new Promise((done) => {
    const socket = new Socket();
    const finish = (ok: boolean): void => {
      socket.destroy();
      done(ok);
    };
    socket.setTimeout(500, () => finish(false));
    socket.once('error', () => finish(false));
    socket.connect(port, '127.0.0.1', () => socket.write('PING\r\n'));
    socket.once('data', (data) => finish(data.toString().startsWith('+PONG')));
  });
}
