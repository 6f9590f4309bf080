/**
 * The HTTP edge on a real app: hostile JSON nesting, page numbers past any offset SQLite can
 * take, Cache-Control on API responses, and LIKE wildcards in text searches.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import { MAX_BODY_DEPTH } from '../src/common/http/json-depth';
import { MAX_PAGE } from '../src/common/pagination/page-query.dto';
import { countOf } from './helpers/row-count';
import { useTestApp } from './helpers/test-app';
import { getAs } from './helpers/api-call';

/** `levels` arrays nested in one another around a number: `[[…[1]…]]`. */
const nestedArrays = (levels: number): string => `${'['.repeat(levels)}1${']'.repeat(levels)}`;

describe('HTTP edge', () => {
  const t = useTestApp();

  const count = (table: string): Promise<number> => countOf(t, table);

  describe(`JSON nesting deeper than ${MAX_BODY_DEPTH} levels (common practice: bound recursion on untrusted input)`, () => {
    it('POST /api/auth/sign-in with a 39 KB body of nested arrays answers 400 naming the depth, and writes nothing', async () => {
      const auditBefore = await count('audit_entry');
      const body = nestedArrays(20_000);
      expect(body.length).toBeGreaterThan(39_000);
      const response = await request(t.url)
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/json')
        .send(body);
      expect(response.status).toBe(400);
      expect(response.body).toEqual({
        statusCode: 400,
        code: 'REQUEST_BODY_TOO_DEEP',
        message: expect.stringMatching(/request body: .*more than 32 levels/),
        details: { field: 'body', maxDepth: MAX_BODY_DEPTH },
      });
      expect(await count('audit_entry')).toBe(auditBefore);
    });

    it('the nesting inside a property counts too (sign-in with a deep e-mail value)', async () => {
      const response = await request(t.url)
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/json')
        .send(`{"email":${nestedArrays(5_000)},"password":"x"}`);
      expect(response.status).toBe(400);
      expect(response.body.code).toBe('REQUEST_BODY_TOO_DEEP');
    });

    it('an authenticated route (POST /api/participants) answers 400 and creates no participant', async () => {
      const before = await count('participant');
      const response = await request(t.url)
        .post('/api/participants')
        .set(await t.authHeader('technician'))
        .set('Content-Type', 'application/json')
        .send(`{"code":${nestedArrays(10_000)}}`);
      expect(response.status).toBe(400);
      expect(response.body.code).toBe('REQUEST_BODY_TOO_DEEP');
      expect(await count('participant')).toBe(before);
    });

    it(`exactly ${MAX_BODY_DEPTH} levels pass the depth check and meet the ordinary validation`, async () => {
      // The object itself is level 1, so the value may hold 31 more.
      const response = await request(t.url)
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/json')
        .send(`{"email":${nestedArrays(MAX_BODY_DEPTH - 1)},"password":"x"}`);
      expect(response.status).toBe(400);
      expect(response.body.code).toBe('VALIDATION_FAILED');
      const deeper = await request(t.url)
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/json')
        .send(`{"email":${nestedArrays(MAX_BODY_DEPTH)},"password":"x"}`);
      expect(deeper.body.code).toBe('REQUEST_BODY_TOO_DEEP');
    });

    it('a deeply nested urlencoded form is refused with 400 as well, never 500', async () => {
      const key = `a${'[b]'.repeat(60)}`;
      const response = await request(t.url)
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/x-www-form-urlencoded')
        .send(`${key}=1`);
      expect(response.status).toBe(400);
      expect(response.body).toMatchObject({ statusCode: 400, code: expect.any(String) });
    });
  });

  describe('page numbers (common practice: bound the offset to a safe integer)', () => {
    it.each([
      ['/api/participants', 'technician'],
      ['/api/visits', 'technician'],
      ['/api/audit', 'admin'],
      ['/api/users', 'admin'],
      ['/api/sites', 'admin'],
    ] as const)('%s?page=1e300 answers 400 naming page', async (path, user) => {
      const response = await request(t.url)
        .get(`${path}?page=1e300`)
        .set(await t.authHeader(user));
      expect(response.status).toBe(400);
      expect(response.body.code).toBe('VALIDATION_FAILED');
      expect(response.body.message).toMatch(/^page must not be greater than/);
    });

    it('the last allowed page still answers 200 (empty), one more is 400', async () => {
      const header = await t.authHeader('technician');
      const last = await request(t.url)
        .get(`/api/participants?page=${MAX_PAGE}&pageSize=200`)
        .set(header);
      expect(last.status).toBe(200);
      expect(last.body).toMatchObject({ items: [], page: MAX_PAGE, pageSize: 200 });
      expect(Number.isSafeInteger((MAX_PAGE - 1) * 200)).toBe(true);
      const beyond = await request(t.url)
        .get(`/api/participants?page=${MAX_PAGE + 1}`)
        .set(header);
      expect(beyond.status).toBe(400);
      expect(beyond.body.message).toMatch(/page/);
    });

    it('pageSize stays bounded at 200', async () => {
      const response = await getAs(t, 'technician', '/api/participants?pageSize=1e300');
      expect(response.status).toBe(400);
      expect(response.body.message).toMatch(/pageSize must not be greater than 200/);
    });
  });

  describe('Cache-Control: no-store on API responses (RFC 9111 §5.2.2.5; OWASP ASVS 4.0 8.2.1)', () => {
    it.each([
      ['GET /api/auth/me', 'analyst', '/api/auth/me', 200],
      ['results: GET /api/participants/:id/trajectory', 'analyst', 'trajectory', 200],
      ['GET /api/audit/export.csv', 'admin', '/api/audit/export.csv', 200],
      ['GET /api/visits', 'technician', '/api/visits', 200],
      ['an unknown route (404)', 'analyst', '/api/no-such-route', 404],
    ] as const)('%s', async (_name, user, path, status) => {
      const url =
        path === 'trajectory' ? `/api/participants/${t.seed.participants.A1.id}/trajectory` : path;
      const response = await request(t.url)
        .get(url)
        .set(await t.authHeader(user));
      expect(response.status).toBe(status);
      expect(response.headers['cache-control']).toBe('no-store');
    });

    it('errors before any route (401 without a token, 400 on bad JSON) carry it too', async () => {
      const unauthenticated = await request(t.url).get('/api/participants');
      expect(unauthenticated.status).toBe(401);
      expect(unauthenticated.headers['cache-control']).toBe('no-store');
      const badJson = await request(t.url)
        .post('/api/auth/sign-in')
        .set('Content-Type', 'application/json')
        .send('{"email":');
      expect(badJson.status).toBe(400);
      expect(badJson.headers['cache-control']).toBe('no-store');
    });

    it("the client's static assets keep their own caching (fonts: immutable, 30 days)", async () => {
      const font = readdirSync(join(__dirname, '..', '..', 'fonts')).find(
        (f) => f.endsWith('.woff2') || f.endsWith('.woff'),
      );
      const response = await request(t.url).get(`/fonts/${font}`);
      expect(response.status).toBe(200);
      expect(response.headers['cache-control']).toMatch(/max-age=2592000/);
      expect(response.headers['cache-control']).not.toMatch(/no-store/);
    });
  });

  describe("text search: '_' and '%' match themselves (SQLite LIKE … ESCAPE, common practice)", () => {
    let studyId: string;
    beforeAll(async () => {
      studyId = t.seed.studies.A.id;
      const admin = await t.authHeader('admin');
      for (const [code, name] of [
        ['LIT-1', 'Lab_North 100% intake'],
        ['LIT-2', 'LabXNorth 1000 intake'],
        ['LIT-3', 'Back\\slash lab'],
      ]) {
        const created = await request(t.url)
          .post('/api/sites')
          .set(admin)
          .send({ studyId, code, name });
        expect(created.status).toBe(201);
      }
    });

    const siteNames = async (q: string): Promise<string[]> => {
      const response = await getAs(t, 'admin', '/api/sites', { q, studyId });
      expect(response.status).toBe(200);
      return (response.body.items as Array<{ name: string }>).map((s) => s.name).sort();
    };

    it("'b_N' finds the name with an underscore, not the one with another character there", async () => {
      expect(await siteNames('b_N')).toEqual(['Lab_North 100% intake']);
    });

    it("'100%' finds the literal percent sign, not '1000'", async () => {
      expect(await siteNames('100%')).toEqual(['Lab_North 100% intake']);
    });

    it('a backslash matches itself', async () => {
      expect(await siteNames('k\\s')).toEqual(['Back\\slash lab']);
    });

    it("a participant code search with '_' is no wildcard: 'A1_0001' does not find A1-0001", async () => {
      const header = await t.authHeader('technician');
      const literal = await request(t.url)
        .get('/api/participants')
        .query({ q: 'A1_0001' })
        .set(header);
      expect(literal.status).toBe(200);
      expect(literal.body.items).toEqual([]);
      const plain = await request(t.url)
        .get('/api/participants')
        .query({ q: 'A1-0001' })
        .set(header);
      expect((plain.body.items as Array<{ code: string }>).map((p) => p.code)).toEqual(['A1-0001']);
    });

    it('code OR name with different values in one query keep their own parameters', async () => {
      // Studies search code and name: both filters in one WHERE must not share a parameter.
      const response = await getAs(t, 'admin', '/api/studies', { q: 'ALPHA' });
      expect(response.status).toBe(200);
      expect((response.body.items as Array<{ code: string }>).map((s) => s.code)).toEqual([
        'ALPHA',
      ]);
    });
  });
});
