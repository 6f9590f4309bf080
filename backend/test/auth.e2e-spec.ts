import { createHash } from 'node:crypto';
import request from 'supertest';
import { abilityFromPackedRules, type PackedRules } from '@gyre/shared';
import { accessPayload, forgeJwt } from './helpers/jwt-forge';
import { REFRESH_REUSE_GRACE_MS } from '../src/auth/refresh-tokens.service';
import { SEED_PASSWORD } from './helpers/seed';
import { TEST_JWT_SECRET, useTestApp } from './helpers/test-app';
import { getAs, inviteAs, postAs } from './helpers/api-call';

const REFRESH_COOKIE = 'gyre_refresh';

/** The refresh cookie's `name=value` from a response, and its attributes. */
function refreshCookieOf(response: request.Response): { pair: string; attributes: string } {
  const raw = response.headers['set-cookie'] as unknown;
  const cookies = Array.isArray(raw) ? (raw as string[]) : [];
  const cookie = cookies.find((c) => c.startsWith(`${REFRESH_COOKIE}=`));
  if (cookie === undefined)
    throw new Error(`No ${REFRESH_COOKIE} cookie in ${JSON.stringify(cookies)}`);
  const [pair, ...attributes] = cookie.split(';');
  return { pair, attributes: attributes.join(';') };
}

describe('sign-in, tokens and sessions', () => {
  const t = useTestApp();

  const signIn = (email: string, password: string) =>
    request(t.url).post('/api/auth/sign-in').send({ email, password });

  describe('sign-in', () => {
    it('answers an HS256 access token of 15 minutes and an httpOnly SameSite=Strict cookie', async () => {
      const response = await signIn(t.seed.users.analyst.email, SEED_PASSWORD);
      expect(response.status).toBe(200);
      expect(response.body.tokenType).toBe('Bearer');
      expect(response.body.expiresInS).toBe(900);
      const [header, payload] = (response.body.accessToken as string)
        .split('.')
        .slice(0, 2)
        .map((part) => JSON.parse(Buffer.from(part, 'base64url').toString('utf8')));
      expect(header.alg).toBe('HS256');
      expect(payload.exp - payload.iat).toBe(900);
      expect(payload.sub).toBe(t.seed.users.analyst.id);
      const { attributes } = refreshCookieOf(response);
      expect(attributes).toMatch(/HttpOnly/i);
      expect(attributes).toMatch(/SameSite=Strict/i);
      expect(attributes).toMatch(/Path=\/api\/auth/i);
      expect(JSON.stringify(response.body)).not.toMatch(/passwordHash|\$2[aby]\$/);
    });

    it('stores the password with bcrypt cost ≥ 10 (bcrypt hash format $2b$NN$)', async () => {
      const [row] = (await t.dataSource.query(`SELECT "passwordHash" FROM "user" WHERE "id" = ?`, [
        t.seed.users.analyst.id,
      ])) as { passwordHash: string }[];
      const cost = Number(/^\$2[aby]\$(\d\d)\$/.exec(row.passwordHash)?.[1]);
      expect(cost).toBeGreaterThanOrEqual(10);
    });

    it('refuses a wrong password and an unknown e-mail with the same answer', async () => {
      const wrong = await signIn(t.seed.users.monitor.email, 'not-the-password-at-all');
      const unknown = await signIn('nobody@gyre.test', 'not-the-password-at-all');
      expect(wrong.status).toBe(422);
      expect(unknown.status).toBe(422);
      expect(wrong.body.code).toBe('AUTH_WRONG_CREDENTIALS');
      expect(unknown.body).toEqual(wrong.body);
    });

    it('refuses a body without the password, naming the field', async () => {
      const response = await request(t.url)
        .post('/api/auth/sign-in')
        .send({ email: 'x@gyre.test' });
      expect(response.status).toBe(400);
      expect(response.body.message).toMatch(/password/);
    });
  });

  describe('failed sign-ins', () => {
    // OWASP ASVS 4.0 2.2.1: anti-automation must not let a stranger lock the owner out.
    it('never locks the account: after 5 wrong passwords the right one still works', async () => {
      const email = t.seed.users.coordinatorB.email;
      for (let attempt = 1; attempt <= 5; attempt += 1) {
        const wrong = await signIn(email, `wrong-password-${attempt}`);
        expect(wrong.status).toBe(422);
        expect(wrong.body.code).toBe('AUTH_WRONG_CREDENTIALS');
      }
      expect((await signIn(email, SEED_PASSWORD)).status).toBe(200);
      const [row] = (await t.dataSource.query(
        `SELECT "lockedUntil" FROM "user" WHERE "email" = ?`,
        [email],
      )) as { lockedUntil: string | null }[];
      expect(row.lockedUntil).toBeNull();
    });

    it('a successful sign-in resets the count of wrong passwords', async () => {
      const email = t.seed.users.analystB.email;
      for (let attempt = 1; attempt <= 4; attempt += 1) await signIn(email, 'wrong-password-xx');
      expect((await signIn(email, SEED_PASSWORD)).status).toBe(200);
      for (let attempt = 1; attempt <= 4; attempt += 1) {
        expect((await signIn(email, 'wrong-password-yy')).status).toBe(422);
      }
      expect((await signIn(email, SEED_PASSWORD)).status).toBe(200);
    });
  });

  describe('access tokens the server must refuse', () => {
    const me = (token: string) =>
      request(t.url).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    /** A token signed like the server's (HS256) over `payload`, with `secret`. */
    const hs256 = (payload: Record<string, unknown>, secret = TEST_JWT_SECRET) =>
      forgeJwt({ header: { alg: 'HS256', typ: 'JWT' }, payload, secret });
    const sessionIdOf = async (user: 'analyst' | 'monitor'): Promise<string> => {
      const [, payload] = (await t.tokenFor(user)).split('.');
      return (JSON.parse(Buffer.from(payload, 'base64url').toString('utf8')) as { sid: string })
        .sid;
    };

    it('accepts a token it signed itself (control for the cases below)', async () => {
      const token = hs256({
        ...accessPayload(t.seed.users.analyst.id),
        sid: await sessionIdOf('analyst'),
      });
      expect((await me(token)).status).toBe(200);
    });

    // Common practice: an access token is bound to the session it was issued to.
    it('refuses a well-signed token without a session or with another user’s session', async () => {
      const withoutSession = hs256(accessPayload(t.seed.users.analyst.id));
      expect((await me(withoutSession)).status).toBe(401);
      const othersSession = hs256({
        ...accessPayload(t.seed.users.analyst.id),
        sid: await sessionIdOf('monitor'),
      });
      const response = await me(othersSession);
      expect(response.status).toBe(401);
      expect(response.body.code).toBe('AUTH_SESSION_ENDED');
    });

    it('refuses alg: none (RFC 7518 §3.6 unsecured JWS)', async () => {
      const token = forgeJwt({
        header: { alg: 'none', typ: 'JWT' },
        payload: accessPayload(t.seed.users.admin.id),
      });
      const response = await me(token);
      expect(response.status).toBe(401);
      expect(response.body.code).toBe('AUTH_TOKEN_INVALID');
    });

    it('refuses a token signed with another secret', async () => {
      const token = hs256(
        accessPayload(t.seed.users.admin.id),
        'some-other-secret-that-is-long-enough-1234567890',
      );
      expect((await me(token)).status).toBe(401);
    });

    it('refuses an expired token', async () => {
      const token = hs256(accessPayload(t.seed.users.analyst.id, -60));
      expect((await me(token)).status).toBe(401);
    });

    it('refuses HS512 even with the right secret (HS256 only)', async () => {
      const { createHmac } = await import('node:crypto');
      const encode = (part: object) => Buffer.from(JSON.stringify(part)).toString('base64url');
      const input = `${encode({ alg: 'HS512', typ: 'JWT' })}.${encode(accessPayload(t.seed.users.analyst.id))}`;
      const token = `${input}.${createHmac('sha512', TEST_JWT_SECRET).update(input).digest('base64url')}`;
      expect((await me(token)).status).toBe(401);
    });

    it('refuses a token whose signature was kept but payload changed (role escalation)', async () => {
      const good = await t.tokenFor('technician');
      const [header, , signature] = good.split('.');
      const payload = Buffer.from(
        JSON.stringify({ ...accessPayload(t.seed.users.admin.id), role: 'admin' }),
      ).toString('base64url');
      expect((await me(`${header}.${payload}.${signature}`)).status).toBe(401);
    });
  });

  describe('refresh tokens', () => {
    /** Moves the rotation of `cookie` back past the grace period, instead of waiting for it. */
    const afterGrace = async (cookie: string): Promise<void> => {
      const secret = cookie.slice(`${REFRESH_COOKIE}=`.length);
      await t.dataSource.query(`UPDATE "refresh_token" SET "usedAt" = ? WHERE "tokenHash" = ?`, [
        new Date(Date.now() - REFRESH_REUSE_GRACE_MS - 1000).toISOString(),
        createHash('sha256').update(secret).digest('hex'),
      ]);
    };

    it('rotates on every use: the new cookie works, the old one is refused after the grace', async () => {
      const first = refreshCookieOf(
        await signIn(t.seed.users.technicianB.email, SEED_PASSWORD),
      ).pair;
      const refreshed = await request(t.url).post('/api/auth/refresh').set('Cookie', first);
      expect(refreshed.status).toBe(200);
      expect(typeof refreshed.body.accessToken).toBe('string');
      const second = refreshCookieOf(refreshed).pair;
      expect(second).not.toBe(first);
      const third = await request(t.url).post('/api/auth/refresh').set('Cookie', second);
      expect(third.status).toBe(200);
      await afterGrace(first);
      expect((await request(t.url).post('/api/auth/refresh').set('Cookie', first)).status).toBe(
        401,
      );
    });

    it('reuse of a rotated token after the grace revokes the whole family, including the newest token', async () => {
      const first = refreshCookieOf(await signIn(t.seed.users.monitorB.email, SEED_PASSWORD)).pair;
      const second = refreshCookieOf(
        await request(t.url).post('/api/auth/refresh').set('Cookie', first),
      ).pair;
      await afterGrace(first);
      const reuse = await request(t.url).post('/api/auth/refresh').set('Cookie', first);
      expect(reuse.status).toBe(401);
      expect(reuse.body.code).toBe('AUTH_REFRESH_REUSED');
      const newest = await request(t.url).post('/api/auth/refresh').set('Cookie', second);
      expect(newest.status).toBe(401);
      expect(newest.body.code).toBe('AUTH_REFRESH_INVALID');
      const [entry] = (await t.dataSource.query(
        `SELECT "action", "actorId" FROM "audit_entry" WHERE "action" = 'refresh-reuse' ORDER BY "seq" DESC LIMIT 1`,
      )) as { action: string; actorId: string }[];
      expect(entry.actorId).toBe(t.seed.users.monitorB.id);
    });

    it('sign-out revokes the session on the server', async () => {
      const cookie = refreshCookieOf(
        await signIn(t.seed.users.coordinatorA2.email, SEED_PASSWORD),
      ).pair;
      expect((await request(t.url).post('/api/auth/sign-out').set('Cookie', cookie)).status).toBe(
        204,
      );
      const after = await request(t.url).post('/api/auth/refresh').set('Cookie', cookie);
      expect(after.status).toBe(401);
    });

    it('refuses a missing or made-up refresh cookie', async () => {
      const missing = await request(t.url).post('/api/auth/refresh');
      expect(missing.status).toBe(401);
      expect(missing.body.code).toBe('AUTH_REFRESH_MISSING');
      const madeUp = await request(t.url)
        .post('/api/auth/refresh')
        .set('Cookie', `${REFRESH_COOKIE}=abc`);
      expect(madeUp.status).toBe(401);
    });

    it('a password change ends every session of the user', async () => {
      const email = t.seed.users.technicianA2.email;
      const session = await signIn(email, SEED_PASSWORD);
      const cookie = refreshCookieOf(session).pair;
      const otherDevice = refreshCookieOf(await signIn(email, SEED_PASSWORD)).pair;
      const newPassword = 'teal-river-88-onset-window';
      const change = await request(t.url)
        .post('/api/auth/password')
        .set('Authorization', `Bearer ${session.body.accessToken as string}`)
        .send({ currentPassword: SEED_PASSWORD, newPassword });
      expect(change.status).toBe(204);
      for (const c of [cookie, otherDevice]) {
        expect((await request(t.url).post('/api/auth/refresh').set('Cookie', c)).status).toBe(401);
      }
      expect((await signIn(email, SEED_PASSWORD)).status).toBe(422);
      expect((await signIn(email, newPassword)).status).toBe(200);
    });

    it('refuses a wrong current password with 422, as sign-in and signing do, and keeps the session', async () => {
      // One status for every wrong password (sign-in here, signing in reports-signoff):
      // 422, never 401, which the client would take for an expired session.
      const token = await t.tokenFor('monitor');
      const response = await request(t.url)
        .post('/api/auth/password')
        .set('Authorization', `Bearer ${token}`)
        .send({ currentPassword: 'not-my-password-at-all', newPassword: 'amber-window-77-slate' });
      expect(response.status).toBe(422);
      expect(response.body).toMatchObject({
        statusCode: 422,
        code: 'AUTH_CURRENT_PASSWORD_WRONG',
        details: { field: 'currentPassword' },
      });
      const wrongSignIn = await signIn(t.seed.users.monitor.email, 'not-my-password-at-all');
      expect(wrongSignIn.status).toBe(response.status);
      const me = await request(t.url).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
      expect(me.status).toBe(200);
      expect((await signIn(t.seed.users.monitor.email, SEED_PASSWORD)).status).toBe(200);
    });

    it('refuses a short or common new password, naming the field', async () => {
      const token = await t.tokenFor('analyst');
      for (const newPassword of ['short-pw', 'password1234', 'Qwerty123456']) {
        const response = await request(t.url)
          .post('/api/auth/password')
          .set('Authorization', `Bearer ${token}`)
          .send({ currentPassword: SEED_PASSWORD, newPassword });
        expect(response.status).toBe(400);
        expect(response.body.code).toBe('AUTH_PASSWORD_TOO_WEAK');
        expect(response.body.message).toMatch(/^newPassword: /);
      }
    });

    it('deactivation by an admin ends the sessions and refuses the access token at once', async () => {
      const email = t.seed.users.coordinator.email;
      const session = await signIn(email, SEED_PASSWORD);
      const cookie = refreshCookieOf(session).pair;
      const deactivate = await request(t.url)
        .patch(`/api/users/${t.seed.users.coordinator.id}`)
        .set(await t.authHeader('admin'))
        .send({ state: 'deactivated', reason: 'left the study' });
      expect(deactivate.status).toBe(200);
      expect(deactivate.body.state).toBe('deactivated');
      expect((await request(t.url).post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(
        401,
      );
      const me = await request(t.url)
        .get('/api/auth/me')
        .set('Authorization', `Bearer ${session.body.accessToken as string}`);
      expect(me.status).toBe(401);
      expect((await signIn(email, SEED_PASSWORD)).status).toBe(422);
    });
  });

  describe('GET /api/auth/me', () => {
    it('returns user, study, site and packed rules that unpack to the role’s ability', async () => {
      const response = await getAs(t, 'technician', '/api/auth/me');
      expect(response.status).toBe(200);
      expect(response.body.user.id).toBe(t.seed.users.technician.id);
      expect(response.body.study.id).toBe(t.seed.studies.A.id);
      expect(response.body.site.id).toBe(t.seed.sites.A1.id);
      const ability = abilityFromPackedRules(response.body.rules as PackedRules);
      expect(ability.can('upload', 'Recording')).toBe(true);
      expect(ability.can('read', 'Result')).toBe(false);
      expect(JSON.stringify(response.body)).not.toMatch(/passwordHash|failedSignIns/);
    });

    it('an admin has no study and no site', async () => {
      const response = await getAs(t, 'admin', '/api/auth/me');
      expect(response.body.study).toBeNull();
      expect(response.body.site).toBeNull();
    });
  });

  describe('audit of sign-ins', () => {
    it('records sign-in and failed sign-in with the client address', async () => {
      await signIn(t.seed.users.monitor.email, 'wrong-password-audit');
      await signIn(t.seed.users.monitor.email, SEED_PASSWORD);
      const rows = (await t.dataSource.query(
        `SELECT "action", "reason", "clientIp" FROM "audit_entry" WHERE "actorId" = ? ORDER BY "seq"`,
        [t.seed.users.monitor.id],
      )) as { action: string; reason: string | null; clientIp: string }[];
      const actions = rows.map((row) => row.action);
      expect(actions).toContain('sign-in-failed');
      expect(actions).toContain('sign-in');
      expect(rows.every((row) => /127\.0\.0\.1/.test(row.clientIp))).toBe(true);
      expect(rows.find((row) => row.action === 'sign-in-failed')?.reason).toBe('wrong password');
    });
  });
});

describe('throttling of /api/auth/*', () => {
  const t = useTestApp({ seed: false });

  it('answers 429 once an address exceeds 60 requests a minute', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 61; i += 1) {
      statuses.push((await request(t.url).post('/api/auth/refresh')).status);
    }
    expect(statuses.slice(0, 60).every((status) => status === 401)).toBe(true);
    expect(statuses[60]).toBe(429);
    // Other routes are not throttled by it.
    expect((await request(t.url).get('/api/health')).status).toBe(200);
  });

  // RFC 9110 §10.2.3 (Retry-After: delay-seconds) and RFC 6585 §4 (429 MAY carry Retry-After).
  it('says how long to wait in a standard Retry-After and answers in Gyre’s error shape', async () => {
    const response = await request(t.url).post('/api/auth/refresh');
    expect(response.status).toBe(429);
    expect(response.headers['retry-after']).toMatch(/^\d+$/);
    const seconds = Number(response.headers['retry-after']);
    expect(seconds).toBeGreaterThanOrEqual(1);
    expect(seconds).toBeLessThanOrEqual(60);
    expect(
      Object.keys(response.headers).filter((name) => /retry-after-|ratelimit/i.test(name)),
    ).toEqual([]);
    expect(response.body).toEqual({
      statusCode: 429,
      code: 'AUTH_TOO_MANY_REQUESTS',
      message: `Too many requests from this address: wait ${seconds} s before trying again.`,
      details: { retryAfterS: seconds },
    });
  });
});

// Common practice: messages built from a role read as English ("an analyst", not "a analyst").
describe('messages that name a role', () => {
  const t = useTestApp();

  it('a refused permission says "An analyst may not …"', async () => {
    const response = await inviteAs(t, 'analyst', 'new.person@gyre.test', 'New Person', 'monitor');
    expect(response.status).toBe(403);
    expect(response.body.message).toBe('An analyst may not invite User.');
  });

  it('a missing membership says "an analyst must belong to a study"', async () => {
    const response = await inviteAs(t, 'admin', 'new.analyst@gyre.test', 'New Analyst', 'analyst');
    expect(response.status).toBe(400);
    expect(response.body.message).toBe('studyId: an analyst must belong to a study');
  });

  it('an admin is "An admin" and a technician stays "A technician"', async () => {
    const admin = await postAs(t, 'admin', `/api/visits/${t.seed.visits.A1.id}/report/sign`, {
      password: 'x',
      meaning: 'x',
      fingerprint: 'a'.repeat(64),
    });
    expect(admin.status).toBe(403);
    expect(admin.body.message).toMatch(/^An admin may not /);
    const technician = await inviteAs(
      t,
      'technician',
      'new.person@gyre.test',
      'New Person',
      'monitor',
    );
    expect(technician.status).toBe(403);
    expect(technician.body.message).toMatch(/^A technician may not /);
  });
});
