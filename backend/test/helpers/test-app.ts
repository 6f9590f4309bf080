import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { getDataSourceToken } from '@nestjs/typeorm';
import request from 'supertest';
import { DataSource } from 'typeorm';
import { createApp } from '../../src/app.factory';
import { AppConfig } from '../../src/config/app.config';
import { APP_CONFIG } from '../../src/config/config.module';
import { ComputationsService } from '../../src/processing/computations.service';
import { OutboxService } from '../../src/mail/outbox.service';
import { Seed, SEED_PASSWORD, seedDatabase, UserKey } from './seed';

/** A fixed secret so that tests can forge tokens with it (and with a wrong one). */
export const TEST_JWT_SECRET = 'gyre-test-secret-0123456789abcdefghijklmnopqrstuvwxyz';
export const TEST_PUBLIC_URL = 'http://gyre.test';

export interface TestApp {
  app: NestExpressApplication;
  /** Base URL of the running server on 127.0.0.1 (for supertest: `request(t.url)`). */
  url: string;
  dataDir: string;
  config: AppConfig;
  dataSource: DataSource;
  seed: Seed;
  /** An access token of a seeded user, by real sign-in through the API (cached per app). */
  tokenFor(user: UserKey): Promise<string>;
  /** `{ Authorization: 'Bearer …' }` for a seeded user. */
  authHeader(user: UserKey): Promise<{ Authorization: string }>;
  /** Waits until the outbox has handed every due message to SMTP. */
  mailIdle(): Promise<void>;
  /** Waits until no computation is queued or running. */
  computationsIdle(): Promise<void>;
  close(): Promise<void>;
}

export interface StartTestAppOptions {
  /** Extra or overriding environment variables. */
  env?: Record<string, string>;
  /** Seed the two studies, three sites, users, participants and visits (default true). */
  seed?: boolean;
}

/** Starts the real application on a fresh temporary DATA_DIR (a real SQLite file). */
export async function startTestApp(options: StartTestAppOptions = {}): Promise<TestApp> {
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-test-'));
  const app = await createApp({
    env: {
      NODE_ENV: 'test',
      DATA_DIR: dataDir,
      JWT_SECRET: TEST_JWT_SECRET,
      PUBLIC_URL: TEST_PUBLIC_URL,
      LOG_LEVEL: 'error',
      ...options.env,
    },
  });
  await app.listen(0, '127.0.0.1');
  const address = app.getHttpServer().address() as { port: number };
  const url = `http://127.0.0.1:${address.port}`;
  const dataSource = app.get<DataSource>(getDataSourceToken());
  const seed = options.seed === false ? emptySeed() : await seedDatabase(dataSource);
  const tokens = new Map<UserKey, string>();
  const tokenFor = async (user: UserKey): Promise<string> => {
    const cached = tokens.get(user);
    if (cached !== undefined) return cached;
    const response = await request(url)
      .post('/api/auth/sign-in')
      .send({ email: seed.users[user].email, password: SEED_PASSWORD });
    if (response.status !== 200) {
      throw new Error(
        `Sign-in of ${user} failed: ${response.status} ${JSON.stringify(response.body)}`,
      );
    }
    const token = (response.body as { accessToken: string }).accessToken;
    tokens.set(user, token);
    return token;
  };
  return {
    app,
    url,
    dataDir,
    config: app.get<AppConfig>(APP_CONFIG),
    dataSource,
    seed,
    tokenFor,
    authHeader: async (user) => ({ Authorization: `Bearer ${await tokenFor(user)}` }),
    mailIdle: () => app.get(OutboxService).idle(),
    computationsIdle: () => app.get(ComputationsService).idle(),
    close: async () => {
      await app.close();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/**
 * The app of one `describe` block: started before its tests (`beforeAll`) and closed after
 * them (`afterAll`). The tests read it through the returned object as they would the app
 * itself (`t.url`, `t.authHeader(…)`); reading it outside a test throws.
 */
export function useTestApp(options: StartTestAppOptions = {}): TestApp {
  let started: TestApp | null = null;
  beforeAll(async () => {
    started = await startTestApp(options);
  });
  afterAll(async () => {
    await started?.close();
    started = null;
  });
  return new Proxy({} as TestApp, {
    get: (_target, key: keyof TestApp) => {
      if (started === null) throw new Error('The test app runs only inside its tests and hooks');
      return started[key];
    },
  });
}

function emptySeed(): Seed {
  return new Proxy({} as Seed, {
    get: () => {
      throw new Error('This test app was started with seed: false');
    },
  });
}
