import { availableParallelism } from 'node:os';
import { join, resolve } from 'node:path';
import { workerSettings, WorkerSettingsError } from './worker-settings';

describe('npm run worker settings', () => {
  it('takes the environment, with the defaults the issue names', () => {
    const settings = workerSettings([], { REDIS_URL: 'redis://queue.example:6379/0' });
    expect(settings).toMatchObject({
      redisUrl: 'redis://queue.example:6379/0',
      serverUrl: 'http://127.0.0.1:3000',
      token: { kind: 'file', path: join(resolve('./data'), 'worker-token') },
      concurrency: availableParallelism(),
      lockMs: 30_000,
      stalledIntervalMs: 30_000,
      maxStalled: 1,
    });
  });

  it('prefers options to variables, and a given token to the data folder', () => {
    const settings = workerSettings(['--concurrency', '3', '--server', 'https://gyre.example/'], {
      REDIS_URL: 'rediss://queue.example:6380',
      GYRE_SERVER_URL: 'http://ignored:1',
      GYRE_WORKER_CONCURRENCY: '8',
      GYRE_WORKER_TOKEN: ' gyre_wt_x \n',
      GYRE_DATA_DIR: '/srv/gyre',
    });
    expect(settings).toMatchObject({
      serverUrl: 'https://gyre.example',
      concurrency: 3,
      token: { kind: 'value', value: 'gyre_wt_x' },
    });
    expect(workerSettings([], { REDIS_URL: 'redis://q', DATA_DIR: '/srv/gyre' })).toMatchObject({
      token: { kind: 'file', path: '/srv/gyre/worker-token' },
    });
  });

  it('refuses what it cannot use, naming the option and the variable', () => {
    const refused = (argv: string[], env: Record<string, string>): string => {
      try {
        workerSettings(argv, env);
      } catch (error) {
        expect(error).toBeInstanceOf(WorkerSettingsError);
        return (error as Error).message;
      }
      return 'accepted';
    };
    expect(refused([], {})).toMatch(/^--redis \/ REDIS_URL: .* required/);
    expect(refused([], { REDIS_URL: 'http://q' })).toMatch(/not a redis:\/\/ URL/);
    expect(refused([], { REDIS_URL: 'redis://q', GYRE_WORKER_CONCURRENCY: '0' })).toBe(
      '--concurrency / GYRE_WORKER_CONCURRENCY: 0 is outside 1–256',
    );
    expect(refused([], { REDIS_URL: 'redis://q', GYRE_WORKER_LOCK_MS: 'soon' })).toBe(
      'GYRE_WORKER_LOCK_MS: soon is not a whole number',
    );
  });
});
