/**
 * An access token lives no longer than its session: every event that ends a session refuses
 * the bearer token at the next request, not when it expires 15 minutes later.
 * OWASP ASVS 4.0 3.3.1 (logout invalidates the session token, so the back button or a
 * downstream party cannot resume it) and 3.3.3 (after a password change other sessions can be
 * ended: Gyre ends all, as its API says); common practice for role or site changes and locks.
 */
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { Report } from '../src/reports/report.entity';
import { SEED_PASSWORD, UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';

const REFRESH_COOKIE = 'gyre_refresh';

interface Session {
  token: string;
  cookie: string;
}

describe('ending a session refuses its access tokens at once', () => {
  const t = useTestApp();

  const signIn = async (user: UserKey, password = SEED_PASSWORD): Promise<Session> => {
    const response = await request(t.url)
      .post('/api/auth/sign-in')
      .send({ email: t.seed.users[user].email, password });
    expect(response.status).toBe(200);
    const cookies = response.headers['set-cookie'] as unknown as string[];
    const cookie = cookies.find((c) => c.startsWith(`${REFRESH_COOKIE}=`));
    if (cookie === undefined) throw new Error('no refresh cookie');
    return { token: response.body.accessToken as string, cookie: cookie.split(';')[0] };
  };
  const me = (token: string) =>
    request(t.url).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
  const expectEnded = async (token: string): Promise<void> => {
    const response = await me(token);
    expect(response.status).toBe(401);
    expect(response.body.code).toBe('AUTH_SESSION_ENDED');
  };
  const refresh = (cookie: string) =>
    request(t.url).post('/api/auth/refresh').set('Cookie', cookie);
  const patchUser = async (user: UserKey, body: Record<string, unknown>) =>
    request(t.url)
      .patch(`/api/users/${t.seed.users[user].id}`)
      .set(await t.authHeader('admin'))
      .send(body);

  it('sign-out: the bearer token of that session is refused; another session goes on', async () => {
    const leaving = await signIn('technicianB');
    const otherDevice = await signIn('technicianB');
    expect((await me(leaving.token)).status).toBe(200);
    const out = await request(t.url).post('/api/auth/sign-out').set('Cookie', leaving.cookie);
    expect(out.status).toBe(204);
    await expectEnded(leaving.token);
    expect((await me(otherDevice.token)).status).toBe(200);
    expect((await refresh(otherDevice.cookie)).status).toBe(200);
  });

  it('password change: the token used for it and every other session are refused', async () => {
    const here = await signIn('technicianA2');
    const elsewhere = await signIn('technicianA2');
    const change = await request(t.url)
      .post('/api/auth/password')
      .set('Authorization', `Bearer ${here.token}`)
      .send({ currentPassword: SEED_PASSWORD, newPassword: 'quiet-harbor-73-alpha-band' });
    expect(change.status).toBe(204);
    await expectEnded(here.token);
    await expectEnded(elsewhere.token);
    expect((await refresh(elsewhere.cookie)).status).toBe(401);
  });

  it('role change: the old token (with the old rights) is refused', async () => {
    const session = await signIn('analystB');
    const change = await patchUser('analystB', { role: 'monitor', reason: 'now monitors' });
    expect(change.status).toBe(200);
    expect(change.body.role).toBe('monitor');
    await expectEnded(session.token);
    expect((await refresh(session.cookie)).status).toBe(401);
    // Signing in again gives the new role.
    const again = await signIn('analystB');
    expect((await me(again.token)).body.user.role).toBe('monitor');
  });

  it('site change: the old token is refused', async () => {
    const session = await signIn('technician');
    const change = await patchUser('technician', {
      siteId: t.seed.sites.A2.id,
      reason: 'moved to site A2',
    });
    expect(change.status).toBe(200);
    expect(change.body.siteId).toBe(t.seed.sites.A2.id);
    await expectEnded(session.token);
  });

  it('a session ended or an account changed by any writer shows at the very next request, however warm', async () => {
    // Nothing keeps sign-in checks between requests: rows changed straight in the database,
    // as the lock trigger or another process changes them, without any service call, count
    // at once after a burst of answered requests.
    const warm = async (token: string): Promise<void> => {
      const answers = await Promise.all(Array.from({ length: 10 }, () => me(token)));
      expect(answers.map((a) => a.status)).toEqual(Array(10).fill(200));
    };
    const ended = await signIn('monitorB');
    const other = await signIn('monitorB');
    await warm(ended.token);
    const familyOf = (token: string): string =>
      (
        JSON.parse(Buffer.from(token.split('.')[1], 'base64url').toString('utf8')) as {
          sid: string;
        }
      ).sid;
    await t.dataSource.query(
      `UPDATE "refresh_token" SET "revokedAt" = ?, "revokedReason" = 'test' WHERE "familyId" = ?`,
      [new Date().toISOString(), familyOf(ended.token)],
    );
    await expectEnded(ended.token);
    expect((await me(other.token)).status).toBe(200);

    // The user's site as every request reads it: the rights follow the row at once.
    const moved = await signIn('coordinatorA2');
    const codes = async (): Promise<string[]> => {
      const list = await request(t.url)
        .get('/api/participants')
        .set('Authorization', `Bearer ${moved.token}`);
      expect(list.status).toBe(200);
      return (list.body as { items: { code: string }[] }).items.map((p) => p.code);
    };
    await warm(moved.token);
    expect(await codes()).toEqual([t.seed.participants.A2.code]);
    await t.dataSource.query(`UPDATE "user" SET "siteId" = ? WHERE "id" = ?`, [
      t.seed.sites.A1.id,
      t.seed.users.coordinatorA2.id,
    ]);
    expect(await codes()).toEqual([t.seed.participants.A1.code]);
    await t.dataSource.query(`UPDATE "user" SET "state" = 'deactivated' WHERE "id" = ?`, [
      t.seed.users.coordinatorA2.id,
    ]);
    const refused = await me(moved.token);
    expect(refused.status).toBe(401);
    expect(refused.body.code).toBe('AUTH_TOKEN_INVALID');
  });

  it('a change of name only keeps the session (control)', async () => {
    const session = await signIn('coordinatorB');
    const change = await patchUser('coordinatorB', { name: 'Coordinator B (renamed)' });
    expect(change.status).toBe(200);
    expect((await me(session.token)).status).toBe(200);
    expect((await refresh(session.cookie)).status).toBe(200);
  });

  it('lock: five wrong passwords at signing lock the account and refuse its tokens', async () => {
    // A draft report of visit A1 (generated test data), so that signing reaches the password.
    const at = new Date().toISOString();
    const visit = t.seed.visits.A1;
    await t.dataSource.getRepository(Report).insert({
      id: randomUUID(),
      visitId: visit.id,
      participantId: t.seed.participants.A1.id,
      studyId: visit.studyId,
      siteId: visit.siteId,
      state: 'draft',
      createdAt: at,
      updatedAt: at,
    });
    const session = await signIn('analyst');
    const statuses: number[] = [];
    for (let attempt = 1; attempt <= 5; attempt += 1) {
      const response = await request(t.url)
        .post(`/api/visits/${visit.id}/report/sign`)
        .set('Authorization', `Bearer ${session.token}`)
        .send({
          password: `not-my-password-${attempt}`,
          meaning: SIGNATURE_MEANING,
          fingerprint: 'a'.repeat(64),
        });
      statuses.push(response.status);
    }
    expect(statuses).toEqual([422, 422, 422, 422, 423]);
    await expectEnded(session.token);
    expect((await refresh(session.cookie)).status).toBe(401);
    const [row] = (await t.dataSource.query(
      `SELECT COUNT(*) AS "open" FROM "refresh_token" WHERE "userId" = ? AND "revokedAt" IS NULL`,
      [t.seed.users.analyst.id],
    )) as { open: number }[];
    expect(row.open).toBe(0);
    // While locked, a wrong password is answered as for any account; only the right one
    // (its owner) learns of the lock.
    const wrong = await request(t.url)
      .post('/api/auth/sign-in')
      .send({ email: t.seed.users.analyst.email, password: 'not-my-password-6' });
    expect(wrong.status).toBe(422);
    expect(wrong.body.code).toBe('AUTH_WRONG_CREDENTIALS');
    const right = await request(t.url)
      .post('/api/auth/sign-in')
      .send({ email: t.seed.users.analyst.email, password: SEED_PASSWORD });
    expect(right.status).toBe(423);
    expect(right.body.code).toBe('AUTH_ACCOUNT_LOCKED');
  });
});
