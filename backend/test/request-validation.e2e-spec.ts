/**
 * What a malformed request gets back, whatever the route: a 400 `VALIDATION_FAILED` whose
 * `details.problems` are `{ field, reason }` items. Route ids are walked from the server's own
 * OpenAPI description, so a new route is covered without being listed here.
 */
import request from 'supertest';
import type { UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';

const ROLES: UserKey[] = ['admin', 'analyst', 'technician', 'monitor', 'coordinator'];
const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;
type Method = (typeof METHODS)[number];

interface OpenApiDocument {
  paths: Record<string, Partial<Record<Method, { parameters?: { in: string; name: string }[] }>>>;
}

describe('request validation', () => {
  const t = useTestApp();

  it('a malformed id in any route parameter named id or …Id is a 400 naming it, never a 404', async () => {
    const doc = (await request(t.url).get('/api/docs/openapi.json')).body as OpenApiDocument;
    const routes = Object.entries(doc.paths).flatMap(([path, operations]) =>
      METHODS.flatMap((method) => {
        const params = (operations[method]?.parameters ?? []).filter(
          (p) => p.in === 'path' && (p.name === 'id' || p.name.endsWith('Id')),
        );
        return params.length === 0 ? [] : [{ path, method, params: params.map((p) => p.name) }];
      }),
    );
    // Today's routes by their ids: studies, sites, users, participants, visits, recordings,
    // reports, revisions, worker jobs and tokens, planned visits and groups.
    expect(routes.length).toBeGreaterThan(40);
    const named: string[] = [];
    for (const route of routes) {
      // The first id parameter malformed, any others well-formed (and unknown).
      const [bad, ...rest] = route.params;
      let url = route.path.replace(`{${bad}}`, 'not-a-uuid');
      for (const other of rest)
        url = url.replace(`{${other}}`, '00000000-0000-4000-8000-000000000000');
      url = url.replace(/\{attempt\}/, '1');
      const answers: number[] = [];
      for (const role of ROLES) {
        const response = await request(t.url)
          [route.method](url)
          .set(await t.authHeader(role))
          .send({});
        answers.push(response.status);
        // Guards run before pipes: a role the route is closed to gets its 401/403 first.
        if (response.status === 401 || response.status === 403) continue;
        expect({ route: `${route.method} ${route.path}`, status: response.status }).toEqual({
          route: `${route.method} ${route.path}`,
          status: 400,
        });
        expect(response.body).toMatchObject({
          statusCode: 400,
          code: 'VALIDATION_FAILED',
          message: `${bad}: expected a UUID, found "not-a-uuid"`,
          details: {
            problems: [{ field: bad, reason: `${bad}: expected a UUID, found "not-a-uuid"` }],
          },
        });
        named.push(`${route.method} ${route.path}`);
        break;
      }
      expect({ route: `${route.method} ${route.path}`, answers }).not.toEqual(
        expect.objectContaining({ answers: expect.arrayContaining([404]) }),
      );
    }
    // Every route a seeded user may call was reached (worker-only routes answer users 401/403).
    expect(named.length).toBeGreaterThan(routes.length - 10);
  });

  it('a well-formed but unknown id still answers 404', async () => {
    const response = await request(t.url)
      .get('/api/recordings/00000000-0000-4000-8000-000000000000')
      .set(await t.authHeader('analyst'));
    expect(response.status).toBe(404);
  });

  it('a body that fails its DTO lists each problem as { field, reason }', async () => {
    const response = await request(t.url)
      .post('/api/auth/sign-in')
      .send({ email: 'not-an-address', password: 12, extra: true });
    expect(response.status).toBe(400);
    expect(response.body.code).toBe('VALIDATION_FAILED');
    const problems = response.body.details.problems as { field: string; reason: string }[];
    // One item per failed constraint: the password breaks two (a string, at most N long).
    expect([...new Set(problems.map((p) => p.field))].sort()).toEqual([
      'email',
      'extra',
      'password',
    ]);
    expect(problems.length).toBeGreaterThan(3);
    expect(problems).toContainEqual({ field: 'extra', reason: 'property extra should not exist' });
    for (const problem of problems) expect(problem.reason).toContain(problem.field);
    // The message is the reasons joined, as it was before the items (the client shows it).
    expect(response.body.message).toBe(problems.map((p) => p.reason).join('; '));
  });

  it('a query parameter out of range is one problem naming it', async () => {
    const response = await request(t.url)
      .get('/api/participants?page=1e300')
      .set(await t.authHeader('technician'));
    expect(response.status).toBe(400);
    expect(response.body.details.problems).toEqual([
      { field: 'page', reason: expect.stringMatching(/^page must not be greater than/) },
    ]);
  });
});
