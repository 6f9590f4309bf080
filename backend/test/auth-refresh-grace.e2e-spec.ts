/**
 * Refresh-token rotation with reuse detection (OAuth 2.0 Security BCP, RFC 9700 §4.14.2) and
 * a grace period for the benign race of two tabs refreshing with one cookie (common practice:
 * a short "reuse interval" after rotation yields the same successor).
 * The grace is not waited out: a replay "after the grace" moves the rotation's `usedAt` back.
 */
import { createHash } from 'node:crypto';
import request from 'supertest';
import { REFRESH_REUSE_GRACE_MS } from '../src/auth/refresh-tokens.service';
import { SEED_PASSWORD, UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';

const REFRESH_COOKIE = 'gyre_refresh';

function cookieOf(response: request.Response): string {
  const raw = response.headers['set-cookie'] as unknown;
  const cookies = Array.isArray(raw) ? (raw as string[]) : [];
  const cookie = cookies.find((c) => c.startsWith(`${REFRESH_COOKIE}=`));
  if (cookie === undefined) throw new Error(`No ${REFRESH_COOKIE} cookie in ${response.status}`);
  return cookie.split(';')[0];
}

const secretOf = (cookie: string): string => cookie.slice(`${REFRESH_COOKIE}=`.length);
const hashOf = (cookie: string): string =>
  createHash('sha256').update(secretOf(cookie)).digest('hex');

describe('two refreshes at once, and a replay after the grace period', () => {
  const t = useTestApp();

  const signIn = async (user: UserKey): Promise<string> => {
    const response = await request(t.url)
      .post('/api/auth/sign-in')
      .send({ email: t.seed.users[user].email, password: SEED_PASSWORD });
    expect(response.status).toBe(200);
    return cookieOf(response);
  };
  const refresh = (cookie: string) =>
    request(t.url).post('/api/auth/refresh').set('Cookie', cookie);
  const me = (token: string) =>
    request(t.url).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
  const backdateRotation = async (cookie: string, ms: number): Promise<void> => {
    await t.dataSource.query(`UPDATE "refresh_token" SET "usedAt" = ? WHERE "tokenHash" = ?`, [
      new Date(Date.now() - ms).toISOString(),
      hashOf(cookie),
    ]);
  };

  it('the grace period is ten seconds', () => {
    expect(REFRESH_REUSE_GRACE_MS).toBe(10_000);
  });

  it('two parallel refreshes with one cookie both succeed with the same successor', async () => {
    const first = await signIn('monitor');
    const [a, b] = await Promise.all([refresh(first), refresh(first)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    expect(cookieOf(a)).toBe(cookieOf(b));
    expect(cookieOf(a)).not.toBe(first);
    // Both access tokens work, and the family is intact: the successor refreshes again.
    expect((await me(a.body.accessToken as string)).status).toBe(200);
    expect((await me(b.body.accessToken as string)).status).toBe(200);
    const next = await refresh(cookieOf(a));
    expect(next.status).toBe(200);
    expect((await me(next.body.accessToken as string)).status).toBe(200);
    const reuses = (await t.dataSource.query(
      `SELECT COUNT(*) AS "n" FROM "audit_entry" WHERE "action" = 'refresh-reuse' AND "actorId" = ?`,
      [t.seed.users.monitor.id],
    )) as { n: number }[];
    expect(reuses[0].n).toBe(0);
  });

  it('within the grace, a late tab catches up with the current token of the family', async () => {
    const first = await signIn('monitorB');
    const second = cookieOf(await refresh(first));
    const third = cookieOf(await refresh(second));
    const late = await refresh(first);
    expect(late.status).toBe(200);
    expect(cookieOf(late)).toBe(third);
  });

  it('a replay after the grace still revokes the whole family and its access tokens', async () => {
    const first = await signIn('coordinator');
    const rotated = await refresh(first);
    expect(rotated.status).toBe(200);
    const second = cookieOf(rotated);
    await backdateRotation(first, REFRESH_REUSE_GRACE_MS + 1000);
    const replay = await refresh(first);
    expect(replay.status).toBe(401);
    expect(replay.body.code).toBe('AUTH_REFRESH_REUSED');
    const newest = await refresh(second);
    expect(newest.status).toBe(401);
    expect(newest.body.code).toBe('AUTH_REFRESH_INVALID');
    const ended = await me(rotated.body.accessToken as string);
    expect(ended.status).toBe(401);
    expect(ended.body.code).toBe('AUTH_SESSION_ENDED');
  });

  it('just inside the grace the successor is still given', async () => {
    const first = await signIn('coordinatorA2');
    const second = cookieOf(await refresh(first));
    await backdateRotation(first, REFRESH_REUSE_GRACE_MS - 2000);
    const again = await refresh(first);
    expect(again.status).toBe(200);
    expect(cookieOf(again)).toBe(second);
  });

  it('within the grace after sign-out: refused as ended, not reported as theft', async () => {
    const first = await signIn('analystB');
    const second = cookieOf(await refresh(first));
    expect((await request(t.url).post('/api/auth/sign-out').set('Cookie', second)).status).toBe(
      204,
    );
    const late = await refresh(first);
    expect(late.status).toBe(401);
    expect(late.body.code).toBe('AUTH_REFRESH_INVALID');
  });

  it('the database alone does not yield the successor: only its sealed form is kept', async () => {
    const first = await signIn('technicianB');
    const second = cookieOf(await refresh(first));
    const rows = (await t.dataSource.query(`SELECT * FROM "refresh_token" WHERE "userId" = ?`, [
      t.seed.users.technicianB.id,
    ])) as Record<string, unknown>[];
    const dump = JSON.stringify(rows);
    expect(dump).not.toContain(secretOf(first));
    expect(dump).not.toContain(secretOf(second));
    const spent = rows.find((row) => row.tokenHash === hashOf(first));
    expect(typeof spent?.successorSealed).toBe('string');
  });
});
