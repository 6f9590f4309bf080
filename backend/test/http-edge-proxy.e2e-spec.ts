/**
 * X-Forwarded-For is a header any client can write (common practice: believe it only from a
 * proxy you run; Express "behind proxies"). Without TRUST_PROXY, Gyre believes nobody: the
 * audited address and the sign-in throttle use the socket's address. With TRUST_PROXY naming
 * the proxy, the address the proxy forwards is used.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { createApp } from '../src/app.factory';
import { validateEnvironment, EnvironmentError } from '../src/config/environment';
import { buildAppConfig } from '../src/config/app.config';
import { SEED_PASSWORD } from './helpers/seed';
import { type TestApp, useTestApp } from './helpers/test-app';

const FORGED = '203.0.113.77';
const LOOPBACK = ['127.0.0.1', '::ffff:127.0.0.1', '::1'];

async function lastAudited(t: TestApp, action: string): Promise<string | null> {
  const rows = (await t.dataSource.query(
    `SELECT "clientIp" FROM "audit_entry" WHERE "action" = ? ORDER BY "seq" DESC LIMIT 1`,
    [action],
  )) as Array<{ clientIp: string | null }>;
  expect(rows).toHaveLength(1);
  return rows[0].clientIp;
}

/** The seeded analyst's sign-in, its X-Forwarded-For header saying `forwardedFor`. */
async function analystSignsInFrom(t: TestApp, forwardedFor: string) {
  return request(t.url)
    .post('/api/auth/sign-in')
    .set('X-Forwarded-For', forwardedFor)
    .send({ email: t.seed.users.analyst.email, password: SEED_PASSWORD });
}

describe('without TRUST_PROXY (the default)', () => {
  const t = useTestApp();

  it('a forged X-Forwarded-For does not change the audited address of a sign-in', async () => {
    expect((await analystSignsInFrom(t, FORGED)).status).toBe(200);
    const audited = await lastAudited(t, 'sign-in');
    expect(audited).not.toBe(FORGED);
    expect(LOOPBACK).toContain(audited);
  });

  it('nor that of a failed sign-in', async () => {
    await request(t.url)
      .post('/api/auth/sign-in')
      .set('X-Forwarded-For', FORGED)
      .send({ email: t.seed.users.monitor.email, password: 'not-the-password-1' });
    expect(LOOPBACK).toContain(await lastAudited(t, 'sign-in-failed'));
  });

  it('a new forged address on every request does not escape the 60-a-minute auth throttle', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 62; i++) {
      const response = await request(t.url)
        .post('/api/auth/refresh')
        .set('X-Forwarded-For', `198.51.100.${i + 1}`);
      statuses.push(response.status);
    }
    // Two requests above were already counted against this address in this minute.
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(2);
    expect(statuses[statuses.length - 1]).toBe(429);
  });
});

describe('with TRUST_PROXY=127.0.0.1 (a proxy on this machine)', () => {
  const t = useTestApp({ env: { TRUST_PROXY: '127.0.0.1' } });

  it('the address the proxy forwards is the audited client address', async () => {
    expect((await analystSignsInFrom(t, FORGED)).status).toBe(200);
    expect(await lastAudited(t, 'sign-in')).toBe(FORGED);
  });

  it('only the hop the proxy added counts: an address the client put in front is ignored', async () => {
    await request(t.url)
      .post('/api/auth/sign-in')
      .set('X-Forwarded-For', `10.9.9.9, ${FORGED}`)
      .send({ email: t.seed.users.monitor.email, password: SEED_PASSWORD });
    expect(await lastAudited(t, 'sign-in')).toBe(FORGED);
  });
});

describe('TRUST_PROXY validation (the variable is named, nothing starts)', () => {
  const problemsOf = (value: string): string[] => {
    try {
      validateEnvironment({ TRUST_PROXY: value });
      return [];
    } catch (error) {
      if (error instanceof EnvironmentError) return error.problems;
      throw error;
    }
  };

  it.each([
    ['true', /TRUST_PROXY="true": 'true' found/],
    ['*', /TRUST_PROXY="\*"/],
    ['0.0.0.0/0', /a range that is not every address expected/],
    ['::/0', /a range that is not every address expected/],
    ['10.0.0.0/33', /a prefix length of 1 to 32 expected/],
    ['127.0.0.1,,10.0.0.1', /an empty entry found/],
    ['0', /hop count 0 found, 1 or more expected/],
    ['proxy.example.com', /'proxy.example.com' found/],
  ])('refuses %s', (value, problem) => {
    const problems = problemsOf(value);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(problem);
  });

  it.each([
    ['1', 1],
    ['loopback', ['loopback']],
    ['10.0.0.0/8, 192.168.1.10', ['10.0.0.0/8', '192.168.1.10']],
    ['::1,fd00::/8', ['::1', 'fd00::/8']],
  ])('accepts %s', (value, expected) => {
    expect(problemsOf(value)).toEqual([]);
    const dataDir = mkdtempSync(join(tmpdir(), 'gyre-trust-proxy-'));
    const config = buildAppConfig(
      validateEnvironment({ TRUST_PROXY: value, DATA_DIR: dataDir, JWT_SECRET: 'x'.repeat(40) }),
    );
    expect(config.trustProxy).toEqual(expected);
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('unset trusts nobody', () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'gyre-trust-proxy-'));
    const config = buildAppConfig(
      validateEnvironment({ DATA_DIR: dataDir, JWT_SECRET: 'x'.repeat(40) }),
    );
    expect(config.trustProxy).toBe(false);
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('createApp stops on a bad value with TRUST_PROXY named', async () => {
    await expect(createApp({ env: { NODE_ENV: 'test', TRUST_PROXY: 'true' } })).rejects.toThrow(
      /TRUST_PROXY="true"/,
    );
  });
});
