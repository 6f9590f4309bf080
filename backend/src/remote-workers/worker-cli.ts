/**
 * `npm run worker`: a worker process for a Gyre server that runs with REDIS_URL (see
 * worker-settings.ts for the options, docs/scale-out.md for the topology). It logs one line
 * per job taken and finished; SIGTERM or SIGINT lets the jobs in hand finish, a second one
 * stops at once (BullMQ then gives those jobs to another worker).
 */
import 'reflect-metadata';
import { RemoteWorker } from './remote-worker';
import { WORKER_USAGE, workerSettings, WorkerSettingsError } from './worker-settings';
import { errorMessage } from '../common/errors/error-message';

async function main(): Promise<void> {
  let settings;
  try {
    settings = workerSettings(process.argv.slice(2), process.env);
  } catch (error) {
    const known =
      error instanceof WorkerSettingsError ||
      (error as { code?: string }).code?.startsWith('ERR_PARSE_ARGS');
    process.stderr.write(
      `gyre worker: ${(error as Error).message}\n${known ? `\n${WORKER_USAGE}\n` : ''}`,
    );
    process.exit(2);
  }
  if (settings === 'help') {
    process.stdout.write(`${WORKER_USAGE}\n`);
    return;
  }
  const name = settings.name;
  const log = (line: string): void => {
    process.stdout.write(`${new Date().toISOString()} worker ${name}: ${line}\n`);
  };
  let stopping = false;
  const worker = new RemoteWorker(settings, log, (message) => {
    if (stopping) return;
    stopping = true;
    log(`the server refuses this worker's token (${message}): stopping`);
    setTimeout(() => process.exit(1), 5000).unref();
    void worker.close(true).finally(() => process.exit(1));
  });
  const stop = (signal: NodeJS.Signals): void => {
    if (stopping) {
      // The jobs in hand go back to the queue through BullMQ's stalled-job recovery.
      log(`${signal} again: stopping now`);
      process.exit(130);
    }
    stopping = true;
    log(`${signal}: finishing the jobs in hand`);
    void worker.close().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
  try {
    await worker.start();
  } catch (error) {
    process.stderr.write(`gyre worker: ${errorMessage(error)}\n`);
    await worker.close(true).catch(() => undefined);
    process.exit(1);
  }
}

void main();
