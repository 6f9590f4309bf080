/**
 * `npm run worker` as a child process (the built worker-cli.js, as the root script runs it),
 * for the scale scenario: its log lines are kept and can be waited for, and it can be killed
 * like any process on another machine could die.
 */
import { ChildProcess, spawn } from 'node:child_process';
import { appendFileSync } from 'node:fs';
import { join } from 'node:path';
import { BACKEND_DIR } from '../../robustness/crash/server-process';

export interface WorkerProcessOptions {
  name: string;
  redisUrl: string;
  serverUrl: string;
  /** The server's data folder: the worker reads its `worker-token` file there. */
  dataDir: string;
  concurrency: number;
  /** BullMQ lock and stalled-check settings (short in tests, so a killed job returns soon). */
  lockMs?: number;
  stalledIntervalMs?: number;
  logFile: string;
}

export class WorkerProcess {
  readonly lines: string[] = [];
  private readonly child: ChildProcess;
  private readonly waiters: Array<{
    test: (line: string) => boolean;
    done: (line: string) => void;
  }> = [];
  private exited: Promise<void>;

  constructor(readonly options: WorkerProcessOptions) {
    this.child = spawn(
      process.execPath,
      [join(BACKEND_DIR, 'dist', 'remote-workers', 'worker-cli.js')],
      {
        cwd: BACKEND_DIR,
        env: {
          PATH: process.env.PATH,
          REDIS_URL: options.redisUrl,
          GYRE_SERVER_URL: options.serverUrl,
          GYRE_DATA_DIR: options.dataDir,
          GYRE_WORKER_CONCURRENCY: String(options.concurrency),
          GYRE_WORKER_NAME: options.name,
          ...(options.lockMs === undefined ? {} : { GYRE_WORKER_LOCK_MS: String(options.lockMs) }),
          ...(options.stalledIntervalMs === undefined
            ? {}
            : { GYRE_WORKER_STALLED_INTERVAL_MS: String(options.stalledIntervalMs) }),
        },
        stdio: ['ignore', 'pipe', 'pipe'],
      },
    );
    this.exited = new Promise((done) => this.child.once('exit', () => done()));
    let partial = '';
    const onData = (chunk: Buffer): void => {
      appendFileSync(options.logFile, chunk);
      partial += chunk.toString();
      const parts = partial.split('\n');
      partial = parts.pop() ?? '';
      for (const line of parts) this.take(line);
    };
    this.child.stdout?.on('data', onData);
    this.child.stderr?.on('data', onData);
  }

  get pid(): number | undefined {
    return this.child.pid;
  }

  get running(): boolean {
    return this.child.exitCode === null && this.child.signalCode === null;
  }

  /** The first line (already seen or still to come) that passes `test`. */
  waitForLine(test: (line: string) => boolean, timeoutMs: number): Promise<string> {
    const seen = this.lines.find(test);
    if (seen !== undefined) return Promise.resolve(seen);
    return new Promise((done, fail) => {
      const timer = setTimeout(() => {
        fail(new Error(`worker ${this.options.name}: no such line within ${timeoutMs} ms`));
      }, timeoutMs);
      this.waiters.push({
        test,
        done: (line) => {
          clearTimeout(timer);
          done(line);
        },
      });
    });
  }

  async stop(signal: NodeJS.Signals): Promise<void> {
    if (!this.running) return;
    this.child.kill(signal);
    await this.exited;
  }

  private take(line: string): void {
    this.lines.push(line);
    for (let i = this.waiters.length - 1; i >= 0; i--) {
      if (this.waiters[i].test(line)) {
        this.waiters[i].done(line);
        this.waiters.splice(i, 1);
      }
    }
  }
}

/** BullMQ job ids a worker's log says it took, and finished (worker-cli.ts's log lines). */
export function jobsInLog(lines: readonly string[], verb: 'took' | 'finished'): string[] {
  const pattern = new RegExp(`: ${verb} job (\\S+)`);
  return lines.flatMap((line) => {
    const match = pattern.exec(line);
    return match === null ? [] : [match[1]];
  });
}
