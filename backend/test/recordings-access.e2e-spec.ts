/**
 * Role × route matrix for recordings, jobs, analysis, flags, reports and trajectories:
 * every seeded role (and no sign-in) against every route. `ok` = passed the permission and
 * the scope (2xx, or 409 when the state forbids the action); 403 = the role may never do
 * it; 404 = the row lies outside the caller's study or site (scope applied in the query).
 * Recordings are generated (see recordings-fixtures.ts).
 */
import request from 'supertest';
import type { RecordingView } from '@gyre/shared';
import { currentSettings } from './helpers/analysis-settings';
import { acceptedUpload } from './helpers/accepted-upload';
import { useTestApp } from './helpers/test-app';
import { UserKey } from './helpers/seed';
import { syntheticTaskEdf, waitForState } from './recordings-fixtures';

type Expect = 'ok' | 403 | 404;
type Who = UserKey | 'anonymous';

const USERS: UserKey[] = [
  'technician',
  'technicianA2',
  'technicianB',
  'analyst',
  'analystB',
  'monitor',
  'monitorB',
  'coordinator',
  'coordinatorA2',
  'coordinatorB',
  'admin',
];

/** Default 403 for everyone, then the exceptions. */
function matrix(exceptions: Partial<Record<UserKey, Expect>>): Record<UserKey, Expect> {
  return Object.fromEntries(USERS.map((u) => [u, exceptions[u] ?? 403])) as Record<UserKey, Expect>;
}

const READ_RECORDING = matrix({
  technician: 'ok',
  technicianA2: 404,
  technicianB: 404,
  analyst: 'ok',
  analystB: 404,
  monitor: 'ok',
  monitorB: 404,
});
const READ_RESULT = matrix({ analyst: 'ok', analystB: 404, monitor: 'ok', monitorB: 404 });
const ANALYST_ONLY = matrix({ analyst: 'ok', analystB: 404 });

describe('access to recordings, analysis, flags, reports and trajectories', () => {
  const t = useTestApp();
  let recordingId: string;
  let routes: Array<{
    name: string;
    expect: Record<UserKey, Expect>;
    call: (auth: Record<string, string>) => request.Test;
  }>;

  beforeAll(async () => {
    const uploaded = await acceptedUpload(t, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 30, seed: 51 }),
    });
    recordingId = uploaded.id;
    await waitForState(t, 'technician', recordingId, ['ready']);
    const visit = t.seed.visits.A1.id;
    const study = t.seed.studies.A.id;
    const participant = t.seed.participants.A1.id;
    const { values } = await currentSettings(t, study);
    // Each allowed call adds a version: a new threshold each time (identical values are refused).
    let settingsCalls = 0;
    const get = (path: string) => (auth: Record<string, string>) =>
      request(t.url).get(path).set(auth);
    const post = (path: string, body: object) => (auth: Record<string, string>) =>
      request(t.url).post(path).set(auth).send(body);
    /** `GET /recordings/:id<tail>` of the uploaded recording for each tail, all answered alike. */
    const readsOfTheRecording = (tails: string[], expected: Record<UserKey, Expect>) =>
      tails.map((tail) => ({
        name: `GET /recordings/:id${tail}`,
        expect: expected,
        call: get(`/api/recordings/${recordingId}${tail}`),
      }));
    let uploads = 0;
    // Uploads go to a visit of their own: the seeded visit already has its task recording.
    const uploadVisit = (
      await request(t.url)
        .post('/api/visits')
        .set(await t.authHeader('technician'))
        .send({ participantId: participant, label: 'V-upload', visitDate: '2026-04-01' })
    ).body.id as string;
    routes = [
      {
        name: 'POST /visits/:visitId/recordings',
        expect: matrix({ technician: 'ok', technicianA2: 404, technicianB: 404 }),
        call: (auth) =>
          request(t.url)
            .post(`/api/visits/${uploadVisit}/recordings`)
            .set(auth)
            .field('kind', 'task')
            .attach(
              'file',
              Buffer.from(syntheticTaskEdf({ durationS: 10, seed: 100 + uploads++ })),
              'r.edf',
            ),
      },
      {
        name: 'GET /recordings',
        expect: matrix({
          technician: 'ok',
          technicianA2: 'ok',
          technicianB: 'ok',
          analyst: 'ok',
          analystB: 'ok',
          monitor: 'ok',
          monitorB: 'ok',
        }),
        call: get('/api/recordings'),
      },
      ...readsOfTheRecording(['', '/file', '/events', '/quality'], READ_RECORDING),
      ...readsOfTheRecording(['/results', '/results/raster'], READ_RESULT),
      {
        name: 'GET /recordings/:id/results/curves',
        expect: READ_RESULT,
        call: get(
          `/api/recordings/${recordingId}/results/curves?channel=${encodeURIComponent('EEG O1-REF')}`,
        ),
      },
      ...readsOfTheRecording(['/runs'], READ_RESULT),
      {
        name: 'GET /studies/:id/analysis-settings',
        expect: READ_RESULT,
        call: get(`/api/studies/${study}/analysis-settings`),
      },
      {
        name: 'GET /studies/:id/analysis-settings/versions',
        expect: READ_RESULT,
        call: get(`/api/studies/${study}/analysis-settings/versions`),
      },
      {
        name: 'POST /studies/:id/analysis-settings',
        expect: ANALYST_ONLY,
        call: (auth: Record<string, string>) =>
          post(`/api/studies/${study}/analysis-settings`, {
            ...values,
            rejectionThresholdUv: 100 + ++settingsCalls,
            reason: 'Matrix test: one more settings version',
          })(auth),
      },
      {
        name: 'POST /recordings/:id/runs',
        expect: ANALYST_ONLY,
        call: post(`/api/recordings/${recordingId}/runs`, {}),
      },
      {
        name: 'POST /visits/:id/runs',
        expect: ANALYST_ONLY,
        call: post(`/api/visits/${visit}/runs`, {}),
      },
      {
        name: 'POST /recordings/:id/retry',
        expect: matrix({
          technician: 'ok',
          technicianA2: 404,
          technicianB: 404,
          analyst: 'ok',
          analystB: 404,
        }),
        call: post(`/api/recordings/${recordingId}/retry`, {}),
      },
      {
        name: 'GET /flags',
        expect: matrix({ analyst: 'ok', analystB: 'ok', monitor: 'ok', monitorB: 'ok' }),
        call: get('/api/flags'),
      },
      { name: 'GET /visits/:id/flag', expect: READ_RESULT, call: get(`/api/visits/${visit}/flag`) },
      {
        name: 'POST /visits/:id/flag/raise',
        expect: ANALYST_ONLY,
        call: post(`/api/visits/${visit}/flag/raise`, { reason: 'Matrix test raising the flag' }),
      },
      {
        name: 'POST /visits/:id/flag/clear',
        expect: ANALYST_ONLY,
        call: post(`/api/visits/${visit}/flag/clear`, { reason: 'Matrix test clearing the flag' }),
      },
      {
        name: 'GET /reports',
        expect: matrix({
          analyst: 'ok',
          analystB: 'ok',
          monitor: 'ok',
          monitorB: 'ok',
          coordinator: 'ok',
          coordinatorA2: 'ok',
          coordinatorB: 'ok',
        }),
        call: get('/api/reports'),
      },
      {
        name: 'GET /visits/:id/report (a draft)',
        expect: matrix({
          ...READ_RESULT,
          technician: 403,
          coordinator: 404,
          coordinatorA2: 404,
          coordinatorB: 404,
        }),
        call: get(`/api/visits/${visit}/report`),
      },
      {
        name: 'GET /participants/:id/trajectory',
        expect: READ_RESULT,
        call: get(`/api/participants/${participant}/trajectory`),
      },
      {
        name: 'GET /visits/:id/analysis-override',
        expect: READ_RESULT,
        call: get(`/api/visits/${visit}/analysis-override`),
      },
      {
        // Last: an allowed change re-runs the visit.
        name: 'PUT /visits/:id/analysis-override',
        expect: ANALYST_ONLY,
        call: (auth: Record<string, string>) =>
          request(t.url)
            .put(`/api/visits/${visit}/analysis-override`)
            .set(auth)
            .send({
              roi: ['O1', 'O2'],
              bandHz: null,
              onsetLabel: null,
              reason: 'Matrix test: the visit keeps two channels',
            }),
      },
    ];
    for (const user of USERS) await t.authHeader(user);
  }, 120_000);

  it('covers every route of these modules in the OpenAPI description', async () => {
    const docs = await request(t.url).get('/api/docs/openapi.json');
    const paths = Object.keys(docs.body.paths as Record<string, unknown>);
    // Sign-off's routes (report/sign-off, preview, sign, revisions, files) have their own
    // role matrix in reports-signoff.e2e-spec.ts.
    const signOff = /report\/(sign|preview)|report-revisions|reports\/\{reportId\}\/file/;
    const mine = paths.filter(
      (p) =>
        /recordings|analysis-settings|analysis-override|\/runs|flag|report|trajectory/.test(p) &&
        !signOff.test(p),
    );
    const covered = new Set(routes.map((r) => r.name.split(' ')[1].replace(/:(\w+)/g, '{$1}')));
    expect(mine.length).toBe(22);
    for (const path of mine) {
      const short = path
        .replace('/api', '')
        .replace(/\{(\w+)\}/g, (_m, name: string) =>
          name === 'visitId' ||
          name === 'recordingId' ||
          name === 'studyId' ||
          name === 'participantId'
            ? '{id}'
            : `{${name}}`,
        );
      expect([...covered].map((c) => c.replace(/\{\w+\}/g, '{id}'))).toContain(short);
    }
  });

  it('answers each route per role: allowed, 403 or 404 (and 401 without sign-in)', async () => {
    const table: string[] = [];
    const problems: string[] = [];
    for (const route of routes) {
      const row: string[] = [];
      for (const who of [...USERS, 'anonymous'] as Who[]) {
        const auth = who === 'anonymous' ? {} : await t.authHeader(who);
        const response = await route.call(auth);
        const expected = who === 'anonymous' ? 401 : route.expect[who];
        const passed =
          expected === 'ok'
            ? response.status < 300 || response.status === 409
            : response.status === expected;
        row.push(`${who}=${response.status}`);
        if (!passed)
          problems.push(
            `${route.name} as ${who}: ${response.status} (expected ${expected}) ${JSON.stringify(response.body)}`,
          );
      }
      table.push(`${route.name}: ${row.join(' ')}`);
    }
    expect(problems).toEqual([]);
    expect(table).toHaveLength(routes.length);
  }, 180_000);

  it('keeps other sites and studies out of lists (scope in the query)', async () => {
    for (const who of ['technicianA2', 'technicianB', 'analystB', 'monitorB'] as UserKey[]) {
      const list = await request(t.url)
        .get('/api/recordings')
        .set(await t.authHeader(who));
      expect(list.status).toBe(200);
      expect(list.body.items.map((r: RecordingView) => r.id)).not.toContain(recordingId);
      expect(list.body.total).toBe(0);
    }
    const own = await request(t.url)
      .get('/api/recordings')
      .set(await t.authHeader('technician'));
    expect(own.body.items.map((r: RecordingView) => r.id)).toContain(recordingId);
    // A filter cannot widen the scope.
    const widened = await request(t.url)
      .get('/api/recordings')
      .query({ siteId: t.seed.sites.A1.id })
      .set(await t.authHeader('technicianA2'));
    expect(widened.body.total).toBe(0);
  });
});
