import request from 'supertest';
import type { Seed, UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';

/**
 * Role × endpoint matrix for studies, sites, users, participants, visits, audit and mail.
 * Expected statuses follow the role table of docs/user-guide.md ("Who does what"): 403 where the role may never act, 404 where
 * the row lies outside the user's study or site (it is never loaded), 2xx where allowed.
 */
type Method = 'get' | 'post' | 'patch' | 'delete';
interface Case {
  method: Method;
  path: (seed: Seed) => string;
  body?: (seed: Seed, user: UserKey) => Record<string, unknown>;
  expect: Partial<Record<UserKey, number>>;
}

const ALL: UserKey[] = [
  'admin',
  'technician',
  'technicianA2',
  'analyst',
  'monitor',
  'coordinator',
  'coordinatorA2',
  'technicianB',
  'analystB',
  'monitorB',
  'coordinatorB',
];
const everyone = (status: number, except: Partial<Record<UserKey, number>> = {}) =>
  Object.fromEntries(ALL.map((key) => [key, except[key] ?? status])) as Record<UserKey, number>;

const READ_CASES: [string, Case][] = [
  ['GET /api/studies', { method: 'get', path: () => '/api/studies', expect: everyone(200) }],
  [
    'GET /api/studies/:id (study A)',
    {
      method: 'get',
      path: (s) => `/api/studies/${s.studies.A.id}`,
      expect: everyone(200, { technicianB: 404, analystB: 404, monitorB: 404, coordinatorB: 404 }),
    },
  ],
  ['GET /api/sites', { method: 'get', path: () => '/api/sites', expect: everyone(200) }],
  [
    'GET /api/sites/:id (site A2)',
    {
      method: 'get',
      path: (s) => `/api/sites/${s.sites.A2.id}`,
      expect: everyone(404, {
        admin: 200,
        technicianA2: 200,
        analyst: 200,
        monitor: 200,
        coordinatorA2: 200,
      }),
    },
  ],
  ['GET /api/users', { method: 'get', path: () => '/api/users', expect: everyone(200) }],
  [
    'GET /api/users/:id (the analyst of study A)',
    {
      method: 'get',
      path: (s) => `/api/users/${s.users.analyst.id}`,
      expect: everyone(404, { admin: 200, analyst: 200, monitor: 200 }),
    },
  ],
  [
    'GET /api/participants',
    { method: 'get', path: () => '/api/participants', expect: everyone(200, { admin: 403 }) },
  ],
  [
    'GET /api/participants/:id (site A2)',
    {
      method: 'get',
      path: (s) => `/api/participants/${s.participants.A2.id}`,
      expect: everyone(404, {
        admin: 403,
        technicianA2: 200,
        analyst: 200,
        monitor: 200,
        coordinatorA2: 200,
      }),
    },
  ],
  [
    'GET /api/visits',
    { method: 'get', path: () => '/api/visits', expect: everyone(200, { admin: 403 }) },
  ],
  [
    'GET /api/visits/:id (site A1)',
    {
      method: 'get',
      path: (s) => `/api/visits/${s.visits.A1.id}`,
      expect: everyone(404, {
        admin: 403,
        technician: 200,
        analyst: 200,
        monitor: 200,
        coordinator: 200,
      }),
    },
  ],
  // The audit trail, its check and its export: admins and monitors only.
  ...['/api/audit', '/api/audit/verify', '/api/audit/export.csv'].map((path): [string, Case] => [
    `GET ${path}`,
    {
      method: 'get',
      path: () => path,
      expect: everyone(403, { admin: 200, monitor: 200, monitorB: 200 }),
    },
  ]),
  [
    'GET /api/studies/:id/planned-visits (study A)',
    {
      method: 'get',
      path: (s) => `/api/studies/${s.studies.A.id}/planned-visits`,
      expect: everyone(200, { technicianB: 404, analystB: 404, monitorB: 404, coordinatorB: 404 }),
    },
  ],
  [
    'GET /api/studies/:id/due (study A)',
    {
      method: 'get',
      path: (s) => `/api/studies/${s.studies.A.id}/due`,
      expect: everyone(200, {
        admin: 403,
        technicianB: 404,
        analystB: 404,
        monitorB: 404,
        coordinatorB: 404,
      }),
    },
  ],
  [
    'GET /api/mail/outbox',
    { method: 'get', path: () => '/api/mail/outbox', expect: everyone(403, { admin: 200 }) },
  ],
];

/** Writes that no role but one may do; each allowed call uses a fresh value so it succeeds. */
let counter = 0;
const fresh = () => (counter += 1);

const WRITE_CASES: [string, Case][] = [
  [
    'POST /api/studies',
    {
      method: 'post',
      path: () => '/api/studies',
      body: () => ({ code: `NEW-${fresh()}`, name: 'A new study' }),
      expect: everyone(403, { admin: 201 }),
    },
  ],
  [
    'PATCH /api/studies/:id (study A)',
    {
      method: 'patch',
      path: (s) => `/api/studies/${s.studies.A.id}`,
      body: () => ({ description: `updated ${fresh()}` }),
      expect: everyone(403, { admin: 200 }),
    },
  ],
  [
    'POST /api/studies/:id/groups (study A)',
    {
      method: 'post',
      path: (s) => `/api/studies/${s.studies.A.id}/groups`,
      body: () => ({ name: `Arm ${fresh()}` }),
      expect: everyone(403, { admin: 201 }),
    },
  ],
  [
    'POST /api/sites (in study A)',
    {
      method: 'post',
      path: () => '/api/sites',
      body: (s) => ({ studyId: s.studies.A.id, code: `WEST-${fresh()}`, name: 'A new site' }),
      expect: everyone(403, { admin: 201 }),
    },
  ],
  [
    'PATCH /api/sites/:id (site A1)',
    {
      method: 'patch',
      path: (s) => `/api/sites/${s.sites.A1.id}`,
      body: () => ({ name: `Site A1 (${fresh()})` }),
      expect: everyone(403, { admin: 200 }),
    },
  ],
  [
    'PATCH /api/users/:id (the monitor of study B)',
    {
      method: 'patch',
      path: (s) => `/api/users/${s.users.monitorB.id}`,
      body: () => ({ name: `Monitor B ${fresh()}` }),
      expect: everyone(403, { admin: 200 }),
    },
  ],
  [
    'POST /api/participants at one’s own site',
    {
      method: 'post',
      path: () => '/api/participants',
      body: (s, user) => ({
        siteId: user === 'technicianB' || user.endsWith('B') ? s.sites.B1.id : s.sites.A1.id,
        code: `P-${String(fresh()).padStart(4, '0')}`,
      }),
      // technicianA2 names site A1, which is not theirs: 404, never created.
      expect: everyone(403, { technician: 201, technicianA2: 404, technicianB: 201 }),
    },
  ],
  [
    'PATCH /api/participants/:id (site A1)',
    {
      method: 'patch',
      path: (s) => `/api/participants/${s.participants.A1.id}`,
      body: () => ({ code: `A1-${String(fresh()).padStart(4, '0')}`, reason: 'typo in the code' }),
      expect: everyone(403, { technician: 200, technicianA2: 404, technicianB: 404 }),
    },
  ],
  [
    'POST /api/visits for the participant of site A1',
    {
      method: 'post',
      path: () => '/api/visits',
      body: (s) => ({
        participantId: s.participants.A1.id,
        label: `V${fresh() + 1}`,
        visitDate: '2026-02-01',
      }),
      expect: everyone(403, { technician: 201, technicianA2: 404, technicianB: 404 }),
    },
  ],
  [
    'PATCH /api/visits/:id (site A2)',
    {
      method: 'patch',
      path: (s) => `/api/visits/${s.visits.A2.id}`,
      body: () => ({ visitDate: `2026-01-${String(10 + (fresh() % 18)).padStart(2, '0')}` }),
      expect: everyone(403, { technician: 404, technicianA2: 200, technicianB: 404 }),
    },
  ],
];

describe('role × endpoint matrix', () => {
  const t = useTestApp();

  const call = async (c: Case, user: UserKey) => {
    const req = request(t.url)
      [c.method](c.path(t.seed))
      .set(await t.authHeader(user));
    return c.body === undefined ? req : req.send(c.body(t.seed, user));
  };

  describe.each([...READ_CASES, ...WRITE_CASES])('%s', (_name, c) => {
    it.each(Object.entries(c.expect) as [UserKey, number][])('%s → %i', async (user, status) => {
      const response = await call(c, user);
      expect({ status: response.status, code: response.body?.code }).toMatchObject({ status });
      if (status === 403) expect(response.body.code).toBe('AUTH_FORBIDDEN');
    });
  });
});

describe('scoped lists contain only rows in scope', () => {
  const t = useTestApp();

  const codes = async (user: UserKey, path: string, field = 'code') => {
    const response = await request(t.url)
      .get(path)
      .set(await t.authHeader(user));
    expect(response.status).toBe(200);
    return (response.body.items as Record<string, string>[]).map((item) => item[field]).sort();
  };

  it('participants: a technician sees their site, an analyst the whole study, never another study', async () => {
    expect(await codes('technician', '/api/participants')).toEqual(['A1-0001']);
    expect(await codes('technicianA2', '/api/participants')).toEqual(['A2-0001']);
    expect(await codes('coordinator', '/api/participants')).toEqual(['A1-0001']);
    expect(await codes('analyst', '/api/participants')).toEqual(['A1-0001', 'A2-0001']);
    expect(await codes('monitor', '/api/participants')).toEqual(['A1-0001', 'A2-0001']);
    expect(await codes('analystB', '/api/participants')).toEqual(['B1-0001']);
  });

  it('a filter cannot widen the scope (siteId of another site gives an empty page)', async () => {
    expect(await codes('technician', `/api/participants?siteId=${t.seed.sites.A2.id}`)).toEqual([]);
    expect(await codes('analystB', `/api/participants?siteId=${t.seed.sites.A1.id}`)).toEqual([]);
  });

  it('studies and sites: admins see all, others their own', async () => {
    expect(await codes('admin', '/api/studies')).toEqual(['ALPHA', 'BETA']);
    expect(await codes('technicianB', '/api/studies')).toEqual(['BETA']);
    expect(await codes('technician', '/api/sites')).toEqual(['NORTH']);
    expect(await codes('analyst', '/api/sites')).toEqual(['NORTH', 'SOUTH']);
    expect(await codes('admin', '/api/sites')).toEqual(['EAST', 'NORTH', 'SOUTH']);
  });

  it('users: technicians see only themselves, monitors their study, admins everyone', async () => {
    expect(await codes('technician', '/api/users', 'email')).toEqual([
      t.seed.users.technician.email,
    ]);
    const monitorSees = await codes('monitor', '/api/users?pageSize=100', 'email');
    expect(monitorSees).toContain(t.seed.users.analyst.email);
    expect(monitorSees).not.toContain(t.seed.users.analystB.email);
    expect(monitorSees).not.toContain(t.seed.users.admin.email);
    expect((await codes('admin', '/api/users?pageSize=100', 'email')).length).toBe(11);
  });

  it('lists paginate and sort on the server', async () => {
    const page1 = await request(t.url)
      .get('/api/users?pageSize=4&page=1&sort=email&order=asc')
      .set(await t.authHeader('admin'));
    const page3 = await request(t.url)
      .get('/api/users?pageSize=4&page=3&sort=email&order=asc')
      .set(await t.authHeader('admin'));
    expect(page1.body.total).toBe(11);
    expect(page1.body.items).toHaveLength(4);
    expect(page3.body.items).toHaveLength(3);
    const emails = (page1.body.items as { email: string }[]).map((u) => u.email);
    expect(emails).toEqual([...emails].sort());
    const bad = await request(t.url)
      .get('/api/users?sort=passwordHash')
      .set(await t.authHeader('admin'));
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/sort/);
  });
});
