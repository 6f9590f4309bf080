/**
 * Worker tokens (docs/security.md, "Worker tokens"): admins create, list and revoke them; a
 * worker token authenticates as a worker, not a user, and every route that is not for job
 * inputs or job results refuses it; revocation is immediate; the server writes a fresh local
 * token to DATA_DIR/worker-token at every start. The expectations come from the scale-out
 * issue's words ("a worker token can only read job inputs and write job results, nothing
 * else") and RFC 6750 §3.1 (401 for a revoked or unknown bearer, 403 for too little scope).
 */
import { createHash } from 'node:crypto';
import { chmodSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { RequestMethod } from '@nestjs/common';
import { METHOD_METADATA, PATH_METADATA } from '@nestjs/common/constants';
import { DiscoveryService, MetadataScanner, ModulesContainer, Reflector } from '@nestjs/core';
import request from 'supertest';
import type { AuditEntryView, CreatedWorkerTokenView, Page, WorkerTokenView } from '@gyre/shared';
import { REQUIRED_PERMISSION_KEY, type RequiredPermission } from '../src/auth/decorators';
import { IS_PUBLIC_KEY } from '../src/common/decorators/public.decorator';
import { startTestApp, TestApp, useTestApp } from './helpers/test-app';
import type { UserKey } from './helpers/seed';
import { syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';

const TOKEN_FORMAT =
  /^gyre_wt_([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})\.([A-Za-z0-9_-]{43})$/;

const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

function secretPartOf(token: string): string {
  const match = TOKEN_FORMAT.exec(token);
  if (match === null) throw new Error(`not a worker token: ${token}`);
  return match[2];
}

describe('worker tokens', () => {
  const t = useTestApp();
  let adminName: string;
  beforeAll(async () => {
    const me = await request(t.url)
      .get('/api/auth/me')
      .set(await t.authHeader('admin'));
    adminName = (me.body as { user: { name: string } }).user.name;
  });

  const create = async (name: string, user: UserKey = 'admin') =>
    request(t.url)
      .post('/api/worker-tokens')
      .set(await t.authHeader(user))
      .send({ name });
  const list = async (query: Record<string, string> = {}, user: UserKey = 'admin') =>
    request(t.url)
      .get('/api/worker-tokens')
      .query({ pageSize: '200', ...query })
      .set(await t.authHeader(user));
  const revoke = async (id: string, body: Record<string, unknown> = {}, user: UserKey = 'admin') =>
    request(t.url)
      .post(`/api/worker-tokens/${id}/revoke`)
      .set(await t.authHeader(user))
      .send(body);
  const auditOf = async (objectId: string): Promise<AuditEntryView[]> => {
    const response = await request(t.url)
      .get('/api/audit')
      .query({ objectType: 'WorkerToken', objectId, order: 'asc', pageSize: '50' })
      .set(await t.authHeader('admin'));
    expect(response.status).toBe(200);
    return (response.body as Page<AuditEntryView>).items;
  };

  describe('admin routes', () => {
    it('creates a token and returns its secret once; only the SHA-256 of the secret is stored', async () => {
      const response = await create('compute node 1');
      expect(response.status).toBe(201);
      const created = response.body as CreatedWorkerTokenView;
      expect(created.secret).toMatch(TOKEN_FORMAT);
      expect(created).toMatchObject({
        name: 'compute node 1',
        local: false,
        createdById: t.seed.users.admin.id,
        createdByName: adminName,
        lastUsedAt: null,
        revokedAt: null,
      });
      const rows = (await t.dataSource.query(`SELECT * FROM "worker_token" WHERE "id" = ?`, [
        created.id,
      ])) as { secretHash: string }[];
      // SHA-256 as FIPS 180-4 defines it, computed by Node's OpenSSL binding.
      const expected = createHash('sha256').update(secretPartOf(created.secret)).digest('hex');
      expect(rows[0].secretHash).toBe(expected);
      expect(JSON.stringify(rows)).not.toContain(secretPartOf(created.secret));
    });

    it('lists name, creator, last use and revocation, never a secret or its hash', async () => {
      const created = (await create('compute node 2')).body as CreatedWorkerTokenView;
      const response = await list();
      expect(response.status).toBe(200);
      const page = response.body as Page<WorkerTokenView>;
      const row = page.items.find((item) => item.id === created.id);
      expect(row).toEqual({
        id: created.id,
        name: 'compute node 2',
        local: false,
        createdAt: created.createdAt,
        createdById: t.seed.users.admin.id,
        createdByName: adminName,
        lastUsedAt: null,
        revokedAt: null,
        revokedById: null,
        revokedByName: null,
        revokedReason: null,
      });
      expect(response.text).not.toContain(secretPartOf(created.secret));
      expect(response.text).not.toMatch(/secret/i);
    });

    it('refuses an empty name, a long one, unknown fields, a live duplicate and the local name', async () => {
      const empty = await create('   ');
      expect(empty.status).toBe(400);
      expect(empty.body.message).toMatch(/name/);
      expect((await create('x'.repeat(101))).status).toBe(400);
      const extra = await request(t.url)
        .post('/api/worker-tokens')
        .set(await t.authHeader('admin'))
        .send({ name: 'node x', secret: 'mine' });
      expect(extra.status).toBe(400);
      expect((await create('Node Dup')).status).toBe(201);
      const duplicate = await create('node dup');
      expect(duplicate.status).toBe(409);
      expect(duplicate.body.code).toBe('WORKER_TOKEN_NAME_TAKEN');
      const local = await create('Local Worker');
      expect(local.status).toBe(409);
      expect(local.body.code).toBe('WORKER_TOKEN_NAME_RESERVED');
    });

    it('revokes with a reason, once; a revoked name may be used again', async () => {
      const created = (await create('node to revoke')).body as CreatedWorkerTokenView;
      const response = await revoke(created.id, { reason: 'machine retired' });
      expect(response.status).toBe(200);
      expect(response.body).toMatchObject({
        id: created.id,
        revokedById: t.seed.users.admin.id,
        revokedByName: adminName,
        revokedReason: 'machine retired',
      });
      expect(Date.parse(response.body.revokedAt as string)).not.toBeNaN();
      const again = await revoke(created.id);
      expect(again.status).toBe(409);
      expect(again.body.code).toBe('WORKER_TOKEN_ALREADY_REVOKED');
      expect((await create('node to revoke')).status).toBe(201);
      const revokedOnly = (await list({ state: 'revoked' })).body as Page<WorkerTokenView>;
      expect(revokedOnly.items.map((item) => item.id)).toContain(created.id);
      expect(revokedOnly.items.every((item) => item.revokedAt !== null)).toBe(true);
      const liveOnly = (await list({ state: 'live' })).body as Page<WorkerTokenView>;
      expect(liveOnly.items.map((item) => item.id)).not.toContain(created.id);
    });

    it('answers 404 for an unknown token and 400 for a malformed id or state', async () => {
      const unknown = await revoke('00000000-0000-4000-8000-000000000000');
      expect(unknown.status).toBe(404);
      expect(unknown.body.code).toBe('WORKER_TOKEN_NOT_FOUND');
      expect((await revoke('not-a-uuid')).status).toBe(400);
      expect((await list({ state: 'sleeping' })).status).toBe(400);
      const longReason = await revoke('00000000-0000-4000-8000-000000000000', {
        reason: 'x'.repeat(2001),
      });
      expect(longReason.status).toBe(400);
    });

    it('audits creation and revocation, without the secret', async () => {
      const created = (await create('audited node')).body as CreatedWorkerTokenView;
      expect((await revoke(created.id, { reason: 'test of the trail' })).status).toBe(200);
      const entries = await auditOf(created.id);
      expect(entries.map((entry) => entry.action)).toEqual(['create', 'revoke']);
      for (const entry of entries) {
        expect(entry.actorId).toBe(t.seed.users.admin.id);
        expect(entry.studyId).toBeNull();
        expect(JSON.stringify(entry)).not.toContain(secretPartOf(created.secret));
      }
      expect(entries[1].reason).toBe('test of the trail');
      expect((entries[1].before as WorkerTokenView).revokedAt).toBeNull();
      expect((entries[1].after as WorkerTokenView).revokedAt).not.toBeNull();
    });

    it.each<UserKey>(['technician', 'analyst', 'monitor', 'coordinator'])(
      'refuses a %s: 403 on list, create and revoke',
      async (user) => {
        const target = (await create(`node for ${user}`)).body as CreatedWorkerTokenView;
        expect((await list({}, user)).status).toBe(403);
        expect((await create(`node by ${user}`, user)).status).toBe(403);
        expect((await revoke(target.id, {}, user)).status).toBe(403);
        const still = (await list({ state: 'live' })).body as Page<WorkerTokenView>;
        expect(still.items.map((item) => item.id)).toContain(target.id);
      },
    );

    it('refuses a caller without sign-in: 401', async () => {
      const response = await request(t.url).get('/api/worker-tokens');
      expect(response.status).toBe(401);
    });
  });

  describe('what a worker token may reach', () => {
    let worker: CreatedWorkerTokenView;
    let recordingId: string;
    beforeAll(async () => {
      worker = (await create('reach probe')).body as CreatedWorkerTokenView;
      const uploaded = await upload(t, 'technician', t.seed.visits.A1.id, {
        kind: 'task',
        bytes: syntheticTaskEdf(),
      });
      expect([uploaded.status, uploaded.body]).toEqual([201, expect.anything()]);
      recordingId = (uploaded.body as { id: string }).id;
      await waitForState(t, 'technician', recordingId, ['ready', 'failed']);
    });

    // Each pair: what a person of the right role reads (a control: the data is there), then
    // the same route with the worker token.
    const READS: [string, UserKey, (s: TestApp) => string][] = [
      ['participants', 'technician', () => '/api/participants'],
      ['a participant', 'technician', (s) => `/api/participants/${s.seed.participants.A1.id}`],
      ['the recordings list', 'technician', () => '/api/recordings'],
      ['users', 'admin', () => '/api/users'],
      ['the audit trail', 'admin', () => '/api/audit'],
      ['worker tokens', 'admin', () => '/api/worker-tokens'],
      ['who is signed in', 'technician', () => '/api/auth/me'],
    ];

    it.each(READS)('reads no %s (403)', async (_what, user, path) => {
      const control = await request(t.url)
        .get(path(t))
        .set(await t.authHeader(user));
      expect(control.status).toBe(200);
      const response = await request(t.url).get(path(t)).set(bearer(worker.secret));
      expect(response.status).toBe(403);
      expect(response.body.code).toBe('AUTH_FORBIDDEN');
    });

    it('reads no results (403), which an analyst of the study reads', async () => {
      const state = await waitForState(t, 'technician', recordingId, ['ready', 'failed']);
      expect(state.state).toBe('ready');
      const path = `/api/recordings/${recordingId}/results`;
      expect(
        (
          await request(t.url)
            .get(path)
            .set(await t.authHeader('analyst'))
        ).status,
      ).toBe(200);
      const response = await request(t.url).get(path).set(bearer(worker.secret));
      expect(response.status).toBe(403);
    });

    it('writes nothing a user writes: participants, users, worker tokens (403)', async () => {
      const participant = await request(t.url)
        .post('/api/participants')
        .set(bearer(worker.secret))
        .send({ siteId: t.seed.sites.A1.id, code: 'A1-0099' });
      expect(participant.status).toBe(403);
      const invite = await request(t.url)
        .post('/api/users/invitations')
        .set(bearer(worker.secret))
        .send({ email: 'w@example.org', name: 'W', role: 'admin' });
      expect(invite.status).toBe(403);
      const token = await request(t.url)
        .post('/api/worker-tokens')
        .set(bearer(worker.secret))
        .send({ name: 'made by a worker' });
      expect(token.status).toBe(403);
    });

    it('is refused on every route that is not public and not for job inputs or results', async () => {
      const routes = routesOf(t);
      const closed = routes.filter((route) => !route.isPublic && !route.forWorkers);
      // The app has dozens of routes; a sweep that found few would prove nothing.
      expect(closed.length).toBeGreaterThan(30);
      const answers: string[] = [];
      for (const route of closed) {
        const response = await request(t.url)[route.method](route.url).set(bearer(worker.secret));
        answers.push(`${route.method.toUpperCase()} ${route.url} ${response.status}`);
      }
      expect(answers.filter((answer) => !answer.endsWith(' 403'))).toEqual([]);
    });

    it('marks the token as used', async () => {
      const page = (await list({ state: 'live' })).body as Page<WorkerTokenView>;
      const row = page.items.find((item) => item.id === worker.id);
      expect(row?.lastUsedAt).not.toBeNull();
    });

    it('a revoked token is refused at once (401), an altered or malformed one too', async () => {
      const probe = (await create('soon revoked')).body as CreatedWorkerTokenView;
      const before = await request(t.url).get('/api/participants').set(bearer(probe.secret));
      expect(before.status).toBe(403);
      expect((await revoke(probe.id)).status).toBe(200);
      const after = await request(t.url).get('/api/participants').set(bearer(probe.secret));
      expect(after.status).toBe(401);
      expect(after.body.code).toBe('WORKER_TOKEN_INVALID');
      const secret = secretPartOf(worker.secret);
      const altered = worker.secret.replace(
        secret,
        `${secret.slice(0, -1)}${secret.endsWith('A') ? 'B' : 'A'}`,
      );
      for (const token of [altered, 'gyre_wt_short', `${worker.secret}x`]) {
        const response = await request(t.url).get('/api/participants').set(bearer(token));
        expect([token, response.status]).toEqual([token, 401]);
      }
    });

    it('leaves user sign-in, refresh and their rules as they were', async () => {
      const signIn = await request(t.url)
        .post('/api/auth/sign-in')
        .send({ email: t.seed.users.admin.email, password: 'x'.repeat(3) });
      expect(signIn.status).toBe(422);
      const me = await request(t.url)
        .get('/api/auth/me')
        .set(await t.authHeader('admin'));
      expect(me.status).toBe(200);
      const rules = JSON.stringify(me.body.rules);
      expect(rules).not.toContain('JobInput');
      expect(rules).not.toContain('JobResult');
      expect(rules).toContain('WorkerToken');
    });
  });
});

describe('the local worker token', () => {
  let dataDir: string;
  afterAll(() => {
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('is written 600 at start, authenticates, and is replaced at the next start', async () => {
    dataDir = mkdtempSync(join(tmpdir(), 'gyre-worker-token-'));
    const file = join(dataDir, 'worker-token');
    const first = await startTestApp({ env: { DATA_DIR: dataDir } });
    let firstToken: string;
    let firstId: string;
    try {
      // POSIX mode bits: 0o600 is read and write for the owner only.
      expect((statSync(file).mode & 0o777).toString(8)).toBe('600');
      firstToken = readFileSync(file, 'utf8').trim();
      expect(firstToken).toMatch(TOKEN_FORMAT);
      firstId = (TOKEN_FORMAT.exec(firstToken) as RegExpExecArray)[1];
      const used = await request(first.url).get('/api/participants').set(bearer(firstToken));
      expect(used.status).toBe(403);
      expect(used.body.code).toBe('AUTH_FORBIDDEN');
      const listed = await request(first.url)
        .get('/api/worker-tokens')
        .set(await first.authHeader('admin'));
      const local = (listed.body as Page<WorkerTokenView>).items.filter((item) => item.local);
      expect(local).toEqual([
        expect.objectContaining({
          id: firstId,
          name: 'local worker',
          createdById: null,
          revokedAt: null,
        }),
      ]);
      expect(local[0].lastUsedAt).not.toBeNull();
    } finally {
      await first.close();
    }
    // Someone loosened the file meanwhile: the new one is 600 again.
    chmodSync(file, 0o644);
    const second = await startTestApp({ env: { DATA_DIR: dataDir }, seed: false });
    try {
      expect((statSync(file).mode & 0o777).toString(8)).toBe('600');
      const secondToken = readFileSync(file, 'utf8').trim();
      expect(secondToken).toMatch(TOKEN_FORMAT);
      expect(secondToken).not.toBe(firstToken);
      const old = await request(second.url).get('/api/participants').set(bearer(firstToken));
      expect(old.status).toBe(401);
      const fresh = await request(second.url).get('/api/participants').set(bearer(secondToken));
      expect(fresh.status).toBe(403);
      const rows = (await second.dataSource.query(
        `SELECT "id", "revokedAt", "revokedById", "revokedReason" FROM "worker_token"
          WHERE "local" = 1 ORDER BY "createdAt"`,
      )) as { id: string; revokedAt: string | null; revokedById: string | null }[];
      expect(rows).toHaveLength(2);
      expect(rows[0]).toMatchObject({ id: firstId, revokedById: null });
      expect(rows[0].revokedAt).not.toBeNull();
      expect(rows[1].revokedAt).toBeNull();
      const trail = (await second.dataSource.query(
        `SELECT "action", "actorId", "objectId" FROM "audit_entry"
          WHERE "objectType" = 'WorkerToken' ORDER BY "seq"`,
      )) as { action: string; actorId: string | null; objectId: string }[];
      expect(trail).toEqual([
        { action: 'create', actorId: null, objectId: firstId },
        { action: 'revoke', actorId: null, objectId: firstId },
        { action: 'create', actorId: null, objectId: rows[1].id },
      ]);
    } finally {
      await second.close();
    }
  });
});

interface Route {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  url: string;
  isPublic: boolean;
  /** Requires a subject only worker tokens hold (the job routes of the scale-out work). */
  forWorkers: boolean;
}

/** Every route the app's controllers declare, with each `:param` filled by a made-up UUID. */
function routesOf(t: TestApp): Route[] {
  const discovery = new DiscoveryService(t.app.get(ModulesContainer));
  const scanner = new MetadataScanner();
  const reflector = new Reflector();
  const verbs: Partial<Record<number, Route['method']>> = {
    [RequestMethod.GET]: 'get',
    [RequestMethod.POST]: 'post',
    [RequestMethod.PUT]: 'put',
    [RequestMethod.PATCH]: 'patch',
    [RequestMethod.DELETE]: 'delete',
  };
  const routes: Route[] = [];
  for (const wrapper of discovery.getControllers()) {
    const controller = wrapper.metatype as (new () => object) | null;
    if (controller === null) continue;
    const base = Reflect.getMetadata(PATH_METADATA, controller) as string | undefined;
    for (const name of scanner.getAllMethodNames(controller.prototype)) {
      const handler = (controller.prototype as Record<string, unknown>)[name] as object;
      const path = Reflect.getMetadata(PATH_METADATA, handler) as string | undefined;
      const verb = verbs[Reflect.getMetadata(METHOD_METADATA, handler) as number];
      if (path === undefined || verb === undefined) continue;
      const required = reflector.getAllAndOverride<RequiredPermission | undefined>(
        REQUIRED_PERMISSION_KEY,
        [handler as () => void, controller],
      );
      const url = `/api/${base ?? ''}/${path}`
        .replace(/\/+/g, '/')
        .replace(/\/$/, '')
        .replace(/:\w+/g, '00000000-0000-4000-8000-000000000000');
      routes.push({
        method: verb,
        url,
        isPublic:
          reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, [
            handler as () => void,
            controller,
          ]) === true,
        forWorkers: required?.subject === 'JobInput' || required?.subject === 'JobResult',
      });
    }
  }
  return routes;
}
