/**
 * Failed sign-ins are slowed down, never turned into a lock a stranger can set.
 * OWASP ASVS 4.0 2.2.1 (anti-automation that does not let an attacker lock out a legitimate
 * user) and 2.2.1's note on soft lockouts and rate limiting; OWASP Authentication Cheat Sheet
 * ("Authentication and Error Messages": the same answer whether or not the account exists).
 * Client addresses come from X-Forwarded-For, believed from the loopback proxy only;
 * addresses are from the documentation ranges (RFC 5737).
 */
import request from 'supertest';
import {
  ACCOUNT_SHARE_PER_ADDRESS,
  SIGN_IN_THROTTLE_POLICIES,
} from '../src/auth/sign-in-throttle.service';
import { SEED_PASSWORD, UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));
const median = (values: number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
};

describe('throttling of failed sign-ins', () => {
  const t = useTestApp({ env: { TRUST_PROXY: 'loopback' } });

  const signInFrom = (address: string, email: string, password: string) =>
    request(t.url)
      .post('/api/auth/sign-in')
      .set('X-Forwarded-For', address)
      .send({ email, password });
  const emailOf = (user: UserKey) => t.seed.users[user].email;
  const pairFree = SIGN_IN_THROTTLE_POLICIES.pair.freeFailures;

  it('a known and an unknown account get the same answers, one by one', async () => {
    const attempts = pairFree + 2;
    const known: request.Response[] = [];
    const unknown: request.Response[] = [];
    for (let i = 0; i < attempts; i += 1) {
      known.push(await signInFrom('192.0.2.10', emailOf('monitorB'), `wrong-password-${i}`));
      unknown.push(await signInFrom('192.0.2.11', 'nobody.here@gyre.test', `wrong-password-${i}`));
    }
    const shape = (r: request.Response) => ({
      status: r.status,
      body: r.body as unknown,
      retryAfter: r.headers['retry-after'] as unknown,
    });
    expect(known.map(shape)).toEqual(unknown.map(shape));
    // The first failures are answered plainly, then the wait starts; no 423 ever.
    expect(known.slice(0, pairFree + 1).every((r) => r.status === 422)).toBe(true);
    expect(known[0].body).toEqual({
      statusCode: 422,
      code: 'AUTH_WRONG_CREDENTIALS',
      message: 'E-mail or password is wrong.',
      details: null,
    });
    expect(known[pairFree + 1].status).toBe(429);
  });

  it('a known and an unknown account take similar time (one bcrypt comparison each)', async () => {
    const timed = async (address: string, email: string): Promise<number> => {
      const started = process.hrtime.bigint();
      const response = await signInFrom(address, email, 'wrong-password-timing');
      expect(response.status).toBe(422);
      return Number(process.hrtime.bigint() - started) / 1e6;
    };
    const known: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 5; i += 1) {
      known.push(await timed(`198.51.100.${i + 1}`, emailOf('analystB')));
      unknown.push(await timed(`198.51.100.${i + 101}`, `nobody-${i}@gyre.test`));
    }
    const ratio = median(known) / median(unknown);
    expect(ratio).toBeGreaterThan(0.5);
    expect(ratio).toBeLessThan(2);
  });

  it('many failures from one address do not keep the owner out from another', async () => {
    const email = emailOf('coordinatorB');
    const statuses: number[] = [];
    for (let i = 0; i < 15; i += 1) {
      statuses.push((await signInFrom('203.0.113.66', email, `guess-${i}`)).status);
    }
    expect(statuses).not.toContain(423);
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThan(0);
    const owner = await signInFrom('192.0.2.200', email, SEED_PASSWORD);
    expect(owner.status).toBe(200);
    const [row] = (await t.dataSource.query(`SELECT "lockedUntil" FROM "user" WHERE "email" = ?`, [
      email,
    ])) as { lockedUntil: string | null }[];
    expect(row.lockedUntil).toBeNull();
  });

  it('repeated failures wait longer and longer; a throttled attempt is not even checked', async () => {
    const email = emailOf('technicianB');
    const address = '203.0.113.77';
    for (let i = 0; i < pairFree; i += 1) {
      expect((await signInFrom(address, email, `guess-${i}`)).status).toBe(422);
    }
    expect((await signInFrom(address, email, 'guess-a')).status).toBe(422);
    const first = await signInFrom(address, email, SEED_PASSWORD);
    expect(first.status).toBe(429);
    expect(first.body.code).toBe('AUTH_SIGN_IN_THROTTLED');
    expect(first.headers['retry-after']).toBe('1');
    expect(first.body.message).toBe('Too many failed sign-ins: wait 1 s before trying again.');
    expect(first.body.details).toEqual({ retryAfterS: 1 });
    await sleep(1100);
    expect((await signInFrom(address, email, 'guess-b')).status).toBe(422);
    const second = await signInFrom(address, email, 'guess-c');
    expect(second.status).toBe(429);
    expect(second.headers['retry-after']).toBe('2');
    await sleep(2100);
    // Once the wait is over, the right password works and the count starts again.
    expect((await signInFrom(address, email, SEED_PASSWORD)).status).toBe(200);
    expect((await signInFrom(address, email, 'guess-d')).status).toBe(422);
  });

  it('one address trying many accounts is slowed too (password spraying)', async () => {
    const free = SIGN_IN_THROTTLE_POLICIES.address.freeFailures;
    const address = '203.0.113.88';
    for (let i = 0; i <= free; i += 1) {
      expect((await signInFrom(address, `sprayed-${i}@gyre.test`, 'Summer2026!x')).status).toBe(
        422,
      );
    }
    const next = await signInFrom(address, 'sprayed-next@gyre.test', 'Summer2026!x');
    expect(next.status).toBe(429);
    // The address is slowed, not the accounts: the owner of one signs in from elsewhere.
    expect((await signInFrom('192.0.2.201', emailOf('technicianA2'), SEED_PASSWORD)).status).toBe(
      200,
    );
  });

  it('counts the addresses of one IPv6 /64 as one address', async () => {
    const email = emailOf('coordinator');
    for (let i = 0; i <= pairFree; i += 1) {
      const address = `2001:db8:5:7::${(i + 1).toString(16)}`;
      expect((await signInFrom(address, email, `guess-v6-${i}`)).status).toBe(422);
    }
    const sameNetwork = await signInFrom('2001:db8:5:7:ffff::1', email, 'guess-v6-next');
    expect(sameNetwork.status).toBe(429);
    // Another /64 is another address.
    expect((await signInFrom('2001:db8:5:8::1', email, SEED_PASSWORD)).status).toBe(200);
  });

  it('failures from many addresses slow the account, for a short time only', async () => {
    const email = emailOf('analyst');
    const accountFree = SIGN_IN_THROTTLE_POLICIES.account.freeFailures;
    const addresses = Math.floor(accountFree / ACCOUNT_SHARE_PER_ADDRESS) + 1;
    for (let a = 0; a < addresses; a += 1) {
      for (let i = 0; i < ACCOUNT_SHARE_PER_ADDRESS; i += 1) {
        await signInFrom(`198.18.0.${a + 1}`, email, `guess-${a}-${i}`);
      }
    }
    const owner = await signInFrom('192.0.2.202', email, SEED_PASSWORD);
    expect(owner.status).toBe(429);
    const wait = Number(owner.headers['retry-after']);
    expect(wait).toBeLessThanOrEqual(SIGN_IN_THROTTLE_POLICIES.account.maxDelayMs / 1000);
    await sleep(wait * 1000 + 100);
    expect((await signInFrom('192.0.2.202', email, SEED_PASSWORD)).status).toBe(200);
    // The owner's sign-in does not wipe the attackers' count: the next failure waits longer.
    expect((await signInFrom('198.18.1.1', email, 'guess-after-owner')).status).toBe(422);
    const after = await signInFrom('198.18.1.2', email, 'guess-after-owner-2');
    expect(after.status).toBe(429);
    expect(Number(after.headers['retry-after'])).toBeGreaterThan(wait);
  });

  it('parallel guesses cannot slip through one open window', async () => {
    const email = emailOf('monitor');
    const responses = await Promise.all(
      Array.from({ length: pairFree + 5 }, (_, i) =>
        signInFrom('203.0.113.120', email, `parallel-guess-${i}`),
      ),
    );
    const statuses = responses.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 422)).toHaveLength(pairFree + 1);
    expect(statuses.filter((s) => s === 429)).toHaveLength(4);
  });

  it('audits every failure and the start of each wait, not each refused attempt', async () => {
    const user = t.seed.users.coordinatorA2;
    const address = '203.0.113.99';
    const statuses: number[] = [];
    for (let i = 0; i < pairFree + 3; i += 1) {
      statuses.push((await signInFrom(address, user.email, `guess-${i}`)).status);
    }
    const failures = statuses.filter((s) => s === 422).length;
    const rows = (await t.dataSource.query(
      `SELECT "action", "objectId", "studyId", "siteId", "after", "reason", "clientIp"
         FROM "audit_entry" WHERE "clientIp" = ? ORDER BY "seq"`,
      [address],
    )) as {
      action: string;
      objectId: string | null;
      studyId: string | null;
      siteId: string | null;
      after: string | null;
      reason: string;
    }[];
    expect(rows.filter((r) => r.action === 'sign-in-failed').length).toBe(failures);
    const throttled = rows.filter((r) => r.action === 'sign-in-throttled');
    expect(throttled).toHaveLength(1);
    expect(throttled[0].objectId).toBe(user.id);
    // The study's monitor sees it: the entry carries the account's study and site.
    expect(throttled[0].studyId).toBe(user.studyId);
    expect(throttled[0].siteId).toBe(user.siteId);
    expect(JSON.parse(throttled[0].after ?? '{}')).toMatchObject({
      scope: 'pair',
      email: user.email,
      failures: pairFree + 1,
    });
    expect(throttled[0].reason).toMatch(/this account from this address/);
  });
});
