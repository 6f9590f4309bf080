import request from 'supertest';
import { readMails, tokenFromMail, waitForMail } from './helpers/mail-catcher';
import { SEED_PASSWORD } from './helpers/seed';
import { TEST_PUBLIC_URL, useTestApp } from './helpers/test-app';
import { getAs, inviteAs, postAs } from './helpers/api-call';

describe('invitations, password reset and the outbox (real local SMTP server)', () => {
  const t = useTestApp();

  const invite = async (body: Record<string, unknown>) =>
    postAs(t, 'admin', '/api/users/invitations', body);

  /** `first`, then `second` with the same one-time token: taken once (204), then refused (400). */
  const expectUsedOnce = async (path: string, first: object, second: object) => {
    expect((await request(t.url).post(path).send(first)).status).toBe(204);
    const again = await request(t.url).post(path).send(second);
    expect(again.status).toBe(400);
    return again;
  };

  it('an invitation is e-mailed, its link accepted once only, and the account can sign in', async () => {
    const email = 'new.technician@gyre.test';
    const response = await invite({
      email,
      name: 'New Technician',
      role: 'technician',
      studyId: t.seed.studies.A.id,
      siteId: t.seed.sites.A2.id,
    });
    expect(response.status).toBe(201);
    expect(response.body.state).toBe('invited');
    expect(response.body).not.toHaveProperty('passwordHash');

    const mail = await waitForMail(t.config.mailDir, { to: email, subject: /invited/i });
    expect(mail.text).toContain(`${TEST_PUBLIC_URL}/accept-invite?token=`);
    const token = tokenFromMail(mail, '/accept-invite');
    // The expiry reads as a date-time with its zone, never a raw ISO stamp. Expected words
    // from ICU (Intl, en-GB, UTC), not from Gyre's own formatter.
    const [{ expiresAt }] = (await t.dataSource.query(
      `SELECT "expiresAt" FROM "one_time_token" WHERE "userId" = ?`,
      [response.body.id],
    )) as { expiresAt: string }[];
    const part = (type: string) =>
      new Intl.DateTimeFormat('en-GB', {
        timeZone: 'UTC',
        day: 'numeric',
        month: 'long',
        year: 'numeric',
        hour: '2-digit',
        minute: '2-digit',
        hourCycle: 'h23',
      })
        .formatToParts(new Date(expiresAt))
        .find((p) => p.type === type)?.value;
    expect(mail.text).toContain(
      `expires on ${part('day')} ${part('month')} ${part('year')}, ${part('hour')}:${part('minute')} UTC.`,
    );
    expect(mail.text).not.toMatch(/\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/);

    // Only the token's hash is stored.
    const stored = (await t.dataSource.query(`SELECT "tokenHash" FROM "one_time_token"`)) as {
      tokenHash: string;
    }[];
    expect(stored.some((row) => row.tokenHash === token)).toBe(false);
    expect(stored.every((row) => /^[0-9a-f]{64}$/.test(row.tokenHash))).toBe(true);

    // Signing in before accepting fails.
    const password = 'slate-teal-amber-0042';
    expect((await request(t.url).post('/api/auth/sign-in').send({ email, password })).status).toBe(
      422,
    );

    const weak = await request(t.url)
      .post('/api/auth/accept-invitation')
      .send({ token, password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.code).toBe('AUTH_PASSWORD_TOO_WEAK');

    const again = await expectUsedOnce(
      '/api/auth/accept-invitation',
      { token, password },
      { token, password: 'another-long-password-77' },
    );
    expect(again.body.code).toBe('AUTH_ONE_TIME_TOKEN_USED');

    const signIn = await request(t.url).post('/api/auth/sign-in').send({ email, password });
    expect(signIn.status).toBe(200);
    expect(signIn.body.user.role).toBe('technician');
    expect(signIn.body.user.siteId).toBe(t.seed.sites.A2.id);
  });

  it('the outbox shows the message as sent, without its body, to admins only', async () => {
    await t.mailIdle();
    const response = await getAs(t, 'admin', '/api/mail/outbox', {
      to: 'new.technician@gyre.test',
    });
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(1);
    const [message] = response.body.items as Record<string, unknown>[];
    expect(message.state).toBe('sent');
    expect(message.attempts).toBe(1);
    expect(message.kind).toBe('invitation');
    expect(message).not.toHaveProperty('textBody');
    // The single-use link is not kept once the message is handed to SMTP.
    const [row] = (await t.dataSource.query(
      `SELECT "textBody" FROM "outbox_message" WHERE "id" = ?`,
      [message.id],
    )) as { textBody: string | null }[];
    expect(row.textBody).toBeNull();
    for (const role of ['analyst', 'monitor', 'technician', 'coordinator'] as const) {
      const refused = await request(t.url)
        .get('/api/mail/outbox')
        .set(await t.authHeader(role));
      expect(refused.status).toBe(403);
    }
  });

  it('an expired invitation is refused', async () => {
    const email = 'late.analyst@gyre.test';
    expect(
      (await invite({ email, name: 'Late Analyst', role: 'analyst', studyId: t.seed.studies.B.id }))
        .status,
    ).toBe(201);
    const token = tokenFromMail(
      await waitForMail(t.config.mailDir, { to: email }),
      '/accept-invite',
    );
    await t.dataSource.query(
      `UPDATE "one_time_token" SET "expiresAt" = ? WHERE "userId" = (SELECT "id" FROM "user" WHERE "email" = ?)`,
      [new Date(Date.now() - 1000).toISOString(), email],
    );
    const response = await request(t.url)
      .post('/api/auth/accept-invitation')
      .send({ token, password: 'slate-teal-amber-0043' });
    expect(response.status).toBe(400);
    expect(response.body.code).toBe('AUTH_ONE_TIME_TOKEN_EXPIRED');
  });

  it('refuses an invitation whose role and membership disagree, naming the field', async () => {
    const noSite = await invite({
      email: 'coord.nosite@gyre.test',
      name: 'Coordinator Without Site',
      role: 'coordinator',
      studyId: t.seed.studies.A.id,
    });
    expect(noSite.status).toBe(400);
    expect(noSite.body.code).toBe('USER_MEMBERSHIP_INVALID');
    expect(noSite.body.details.field).toBe('siteId');
    const wrongStudy = await invite({
      email: 'tech.wrongstudy@gyre.test',
      name: 'Technician Wrong Study',
      role: 'technician',
      studyId: t.seed.studies.A.id,
      siteId: t.seed.sites.B1.id,
    });
    expect(wrongStudy.status).toBe(400);
    expect(wrongStudy.body.details.field).toBe('siteId');
    const taken = await invite({
      email: t.seed.users.analyst.email,
      name: 'Duplicate',
      role: 'analyst',
      studyId: t.seed.studies.A.id,
    });
    expect(taken.status).toBe(409);
    expect(taken.body.code).toBe('USER_EMAIL_TAKEN');
  });

  it('only admins invite (analyst, monitor, technician: 403)', async () => {
    for (const role of ['analyst', 'monitor', 'technician', 'coordinator'] as const) {
      const response = await request(t.url)
        .post('/api/users/invitations')
        .set(await t.authHeader(role))
        .send({
          email: `x.${role}@gyre.test`,
          name: 'X',
          role: 'analyst',
          studyId: t.seed.studies.A.id,
        });
      expect(response.status).toBe(403);
    }
  });

  it('password reset: same answer for unknown e-mail, link works once, old sessions end', async () => {
    const before = (await readMails(t.config.mailDir)).length;
    const unknown = await request(t.url)
      .post('/api/auth/password-reset')
      .send({ email: 'ghost@gyre.test' });
    expect(unknown.status).toBe(202);
    const email = t.seed.users.analystB.email;
    const session = await request(t.url)
      .post('/api/auth/sign-in')
      .send({ email, password: SEED_PASSWORD });
    const cookie = (session.headers['set-cookie'] as unknown as string[])[0].split(';')[0];
    const known = await request(t.url).post('/api/auth/password-reset').send({ email });
    expect(known.status).toBe(202);
    const mail = await waitForMail(t.config.mailDir, { to: email, subject: /reset/i });
    await t.mailIdle();
    // Only the known address received anything.
    expect((await readMails(t.config.mailDir)).length).toBe(before + 1);
    const token = tokenFromMail(mail, '/reset-password');
    const newPassword = 'reset-rhythm-2026-gyre';
    await expectUsedOnce(
      '/api/auth/password-reset/confirm',
      { token, newPassword },
      { token, newPassword: 'another-reset-2026-gyre' },
    );
    expect((await request(t.url).post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(401);
    expect(
      (await request(t.url).post('/api/auth/sign-in').send({ email, password: newPassword }))
        .status,
    ).toBe(200);
  });

  it('a made-up reset token is refused', async () => {
    const response = await request(t.url)
      .post('/api/auth/password-reset/confirm')
      .send({ token: 'made-up-token', newPassword: 'reset-rhythm-2026-gyre' });
    expect(response.status).toBe(400);
    expect(response.body.code).toBe('AUTH_ONE_TIME_TOKEN_INVALID');
  });
});

describe('outbox retries when SMTP is unreachable', () => {
  // Port 9 on loopback: nothing listens there, so every attempt fails to connect.
  const t = useTestApp({ env: { SMTP_URL: 'smtp://127.0.0.1:9' } });

  it('keeps the message queued with the error, one attempt made and a later next attempt', async () => {
    const response = await inviteAs(t, 'admin', 'unreachable@gyre.test', 'Unreachable', 'admin');
    expect(response.status).toBe(201);
    await t.mailIdle();
    const outbox = await getAs(t, 'admin', '/api/mail/outbox');
    const [message] = outbox.body.items as {
      state: string;
      attempts: number;
      lastError: string;
      nextAttemptAt: string;
    }[];
    expect(message.state).toBe('queued');
    expect(message.attempts).toBe(1);
    expect(message.lastError).toMatch(/ECONNREFUSED|connect/i);
    // First backoff is 30 s (outbox.service.ts).
    expect(Date.parse(message.nextAttemptAt) - Date.now()).toBeGreaterThan(20_000);
  });
});
