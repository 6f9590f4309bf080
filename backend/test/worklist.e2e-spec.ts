/**
 * The worklist (GET /api/worklist) and the "visit reviewed" act (GET/POST
 * /api/visits/:visitId/review) through the API, on generated recordings
 * (recordings-fixtures.ts) and, for its size, on a few hundred visits written straight into
 * the database.
 */
import { createHash, randomUUID } from 'node:crypto';
import request from 'supertest';
import type {
  RecordingView,
  VisitReviewStateView,
  WorklistView,
  WorklistSection,
  WorklistSectionKey,
} from '@gyre/shared';
import { useTestApp, type TestApp } from './helpers/test-app';
import type { UserKey } from './helpers/seed';
import { syntheticRestEdf, syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';
import { getAs, postAs } from './helpers/api-call';

async function worklist(
  t: TestApp,
  user: UserKey,
  query: Record<string, string | number> = {},
): Promise<WorklistView> {
  const response = await request(t.url)
    .get('/api/worklist')
    .query(query)
    .set(await t.authHeader(user));
  expect(response.status).toBe(200);
  return response.body as WorklistView;
}

function section(list: WorklistView, key: WorklistSectionKey): WorklistSection {
  const found = list.sections.find((s) => s.key === key);
  if (found === undefined) throw new Error(`no section ${key}`);
  return found;
}

const visitsIn = (list: WorklistView, key: WorklistSectionKey): string[] =>
  section(list, key).items.map((i) => i.visitId);

/**
 * The fingerprint as its definition says (visit-reviews/review-fingerprint.ts): SHA-256 of the
 * current runs as `kind:runId`, sorted, joined by newlines — computed here from the
 * database's own rows, not through the code under test.
 */
async function nameOf(t: TestApp, user: UserKey): Promise<string> {
  const [row] = (await t.dataSource.query(`SELECT "name" FROM "user" WHERE "id" = ?`, [
    t.seed.users[user].id,
  ])) as Array<{ name: string }>;
  return row.name;
}

async function fingerprintFromDb(t: TestApp, visitId: string): Promise<string> {
  const rows = (await t.dataSource.query(
    `SELECT "kind", "latestRunId" FROM "recording"
      WHERE "visitId" = ? AND "state" IN ('queued','computing','ready','failed') AND "latestRunId" IS NOT NULL`,
    [visitId],
  )) as Array<{ kind: string; latestRunId: string }>;
  const ids = rows.map((r) => `${r.kind}:${r.latestRunId}`).sort();
  return createHash('sha256').update(ids.join('\n')).digest('hex');
}

describe('worklist and the visit-reviewed act', () => {
  const t = useTestApp();
  let visitA1: string;
  let visitA2: string;
  let restA1: RecordingView;

  beforeAll(async () => {
    visitA1 = t.seed.visits.A1.id;
    visitA2 = t.seed.visits.A2.id;
    const rest = await upload(t, 'technician', visitA1, {
      kind: 'resting',
      bytes: syntheticRestEdf({ peakHz: 10, seed: 41 }),
    });
    const task = await upload(t, 'technician', visitA1, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 60, seed: 41 }),
    });
    expect([rest.status, task.status]).toEqual([201, 201]);
    restA1 = await waitForState(t, 'technician', (rest.body as RecordingView).id, ['ready']);
    await waitForState(t, 'technician', (task.body as RecordingView).id, ['ready']);
    await t.computationsIdle();
  }, 120_000);

  it('lists the computed visit for the analyst: not reviewed, a suggestion, a draft report', async () => {
    const list = await worklist(t, 'analyst');
    expect(list.kind).toBe('review');
    expect(list.readOnly).toBe(false);
    expect(list.sections.map((s) => s.key)).toEqual([
      'unreviewed',
      'suggestions',
      'awaitingSignature',
      'changedSinceSigning',
      'failed',
    ]);
    expect(visitsIn(list, 'unreviewed')).toEqual([visitA1]);
    // The generated task dips −0.6 Hz, past the default −0.2 Hz threshold (docs/method.md §3).
    expect(visitsIn(list, 'suggestions')).toEqual([visitA1]);
    expect(section(list, 'suggestions').items[0].what).toMatch(/ROI Δf −0\.\d\d\u00a0Hz/);
    expect(visitsIn(list, 'awaitingSignature')).toEqual([visitA1]);
    expect(section(list, 'changedSinceSigning').total).toBe(0);
    expect(section(list, 'failed').total).toBe(0);
    const first = section(list, 'unreviewed').items[0];
    expect(first).toMatchObject({
      participantCode: t.seed.participants.A1.code,
      visitLabel: 'V1',
      link: { screen: 'review', visitId: visitA1 },
    });
  });

  it('shows the monitor the same list, read-only', async () => {
    const analyst = await worklist(t, 'analyst');
    const monitor = await worklist(t, 'monitor');
    expect(monitor.readOnly).toBe(true);
    expect(monitor.sections.map((s) => [s.key, s.total])).toEqual(
      analyst.sections.map((s) => [s.key, s.total]),
    );
    // Another study's analyst sees none of it.
    const other = await worklist(t, 'analystB');
    expect(other.sections.every((s) => s.total === 0)).toBe(true);
  });

  it('refuses the review to monitors (403), technicians and coordinators, and hides other studies (404)', async () => {
    const state = await getAs(t, 'monitor', `/api/visits/${visitA1}/review`);
    expect(state.status).toBe(200);
    const seen = state.body as VisitReviewStateView;
    expect(seen).toMatchObject({ reviewed: false, canReview: false, latest: null });
    expect(seen.cannotReviewReason).toBe('Your role does not mark visits reviewed.');
    const post = await postAs(t, 'monitor', `/api/visits/${visitA1}/review`, {
      fingerprint: seen.currentFingerprint,
    });
    expect(post.status).toBe(403);
    for (const user of ['technician', 'coordinator'] as const) {
      const denied = await request(t.url)
        .get(`/api/visits/${visitA1}/review`)
        .set(await t.authHeader(user));
      expect([user, denied.status]).toEqual([user, 403]);
    }
    const otherStudy = await postAs(t, 'analystB', `/api/visits/${visitA1}/review`, {
      fingerprint: seen.currentFingerprint,
    });
    expect(otherStudy.status).toBe(404);
    expect(otherStudy.body.code).toBe('VISIT_REVIEW_VISIT_NOT_FOUND');
  });

  it('refuses a review without results (409) and a malformed or stale fingerprint (400, 409)', async () => {
    const empty = await getAs(t, 'analyst', `/api/visits/${visitA2}/review`);
    expect(empty.body).toMatchObject({ currentFingerprint: null, canReview: false });
    const none = await postAs(t, 'analyst', `/api/visits/${visitA2}/review`, {
      fingerprint: 'a'.repeat(64),
    });
    expect(none.status).toBe(409);
    expect(none.body.code).toBe('VISIT_REVIEW_NO_RESULTS');
    const malformed = await postAs(t, 'analyst', `/api/visits/${visitA1}/review`, {
      fingerprint: 'not hex',
    });
    expect(malformed.status).toBe(400);
    expect(malformed.body.message).toMatch(/fingerprint must be 64 lower-case hex digits/);
    const stale = await postAs(t, 'analyst', `/api/visits/${visitA1}/review`, {
      fingerprint: 'b'.repeat(64),
    });
    expect(stale.status).toBe(409);
    expect(stale.body.code).toBe('VISIT_REVIEW_RESULTS_CHANGED');
    expect(await t.dataSource.query(`SELECT count(*) AS n FROM "visit_review"`)).toEqual([
      { n: 0 },
    ]);
  });

  it('marks the visit reviewed (audited with the fingerprint): off the list, and not twice', async () => {
    const before = (await getAs(t, 'analyst', `/api/visits/${visitA1}/review`))
      .body as VisitReviewStateView;
    const expected = await fingerprintFromDb(t, visitA1);
    expect(before).toMatchObject({ currentFingerprint: expected, canReview: true });
    expect(before.currentRunIds.map((id) => id.split(':')[0])).toEqual(['resting', 'task']);

    const marked = await postAs(t, 'analyst', `/api/visits/${visitA1}/review`, {
      fingerprint: expected,
    });
    expect(marked.status).toBe(201);
    const after = marked.body as VisitReviewStateView;
    expect(after).toMatchObject({
      reviewed: true,
      changedSinceReview: false,
      canReview: false,
      latest: { fingerprint: expected, reviewedByName: await nameOf(t, 'analyst') },
    });

    const entries = (await t.dataSource.query(
      `SELECT "action", "objectId", "actorId", "studyId", "siteId", "after" FROM "audit_entry" WHERE "objectType" = 'VisitReview'`,
    )) as Array<Record<string, string>>;
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({
      action: 'review',
      objectId: after.latest?.id,
      actorId: t.seed.users.analyst.id,
      studyId: t.seed.studies.A.id,
      siteId: t.seed.sites.A1.id,
    });
    expect(JSON.parse(entries[0].after)).toMatchObject({
      visitId: visitA1,
      fingerprint: expected,
      runIds: before.currentRunIds,
    });

    const list = await worklist(t, 'analyst');
    expect(section(list, 'unreviewed').total).toBe(0);
    // Reviewing with the suggestion in view and no flag is the decision not to raise one.
    expect(section(list, 'suggestions').total).toBe(0);
    expect(visitsIn(list, 'awaitingSignature')).toEqual([visitA1]);

    const twice = await postAs(t, 'analyst', `/api/visits/${visitA1}/review`, {
      fingerprint: expected,
    });
    expect(twice.status).toBe(409);
    expect(twice.body.code).toBe('VISIT_REVIEW_ALREADY_REVIEWED');
  });

  it('puts the visit back on the list when a new run changes its results', async () => {
    const replaced = await upload(t, 'technician', visitA1, {
      kind: 'resting',
      bytes: syntheticRestEdf({ peakHz: 9, seed: 43 }),
      replaces: { recordingId: restA1.id, reason: 'Electrode O2 came loose in the first take' },
    });
    expect(replaced.status).toBe(201);
    await waitForState(t, 'technician', (replaced.body as RecordingView).id, ['ready']);
    await t.computationsIdle();

    const state = (await getAs(t, 'analyst', `/api/visits/${visitA1}/review`))
      .body as VisitReviewStateView;
    expect(state).toMatchObject({ reviewed: false, changedSinceReview: true, canReview: true });
    expect(state.currentFingerprint).toBe(await fingerprintFromDb(t, visitA1));
    expect(state.currentFingerprint).not.toBe(state.latest?.fingerprint);

    const list = await worklist(t, 'analyst');
    expect(visitsIn(list, 'unreviewed')).toEqual([visitA1]);
    expect(section(list, 'unreviewed').items[0].what).toMatch(
      new RegExp(
        `^Results changed since ${await nameOf(t, 'analyst')} reviewed them on \\d{4}-\\d\\d-\\d\\d$`,
      ),
    );
  }, 120_000);

  it("gives technicians their own site's uploads that need attention, nobody else's", async () => {
    // Not an EDF file: rejected at the upload (422), kept as a rejected recording.
    const rejected = await upload(t, 'technicianA2', visitA2, {
      kind: 'task',
      bytes: new TextEncoder().encode('this is not an EDF file at all'),
    });
    expect(rejected.status).toBe(422);

    const a2 = await worklist(t, 'technicianA2');
    expect(a2.kind).toBe('uploads');
    expect(a2.sections.map((s) => s.key)).toEqual([
      'rejected',
      'warnings',
      'missingKinds',
      'failed',
    ]);
    expect(section(a2, 'rejected').items).toEqual([
      expect.objectContaining({
        visitId: visitA2,
        kind: 'task',
        link: { screen: 'intake', participantId: t.seed.participants.A2.id, visitId: visitA2 },
      }),
    ]);
    expect(section(a2, 'rejected').items[0].what).toMatch(/^The task upload was rejected: /);
    expect(section(a2, 'missingKinds').items).toEqual([
      expect.objectContaining({ visitId: visitA2, what: 'No resting and no task recording yet' }),
    ]);

    const a1 = await worklist(t, 'technician');
    const a1Visits = a1.sections.flatMap((s) => s.items.map((i) => i.visitId));
    expect(a1Visits).not.toContain(visitA2);
    expect(section(a1, 'rejected').total).toBe(0);
    expect(section(a1, 'missingKinds').total).toBe(0);

    const coordinator = await getAs(t, 'coordinator', '/api/worklist');
    expect(coordinator.status).toBe(403);
  });

  it('checks its query: unknown sort or section 400, a section of another role 400', async () => {
    for (const query of [{ sort: 'random' }, { limit: 0 }, { limit: 201 }, { section: 'nope' }]) {
      const response = await getAs(t, 'analyst', '/api/worklist', query);
      expect([query, response.status]).toEqual([query, 400]);
    }
    const notYours = await getAs(t, 'technician', '/api/worklist', { section: 'unreviewed' });
    expect(notYours.status).toBe(400);
    expect(notYours.body.code).toBe('WORKLIST_SECTION_NOT_YOURS');
  });
});

describe('worklist over a few hundred visits', () => {
  const t = useTestApp();
  const VISITS = 400;
  const REVIEWED = 150;
  const SUGGESTING = 120;
  /**
   * Enrolment of the even participants. Python's calendar arithmetic:
   * `(date(2026, 1, 1) - date(2025, 10, 1)).days == 92`, so their visit on 2026-01-01 is day 92,
   * 8 days after Month 3's target day 84 and past its 7-day window: late by 8.
   */
  const ENROLLED = '2025-10-01';

  /** Visits of study B written straight into the database: two ready recordings with runs each. */
  beforeAll(async () => {
    const site = t.seed.sites.B1;
    const studyId = t.seed.studies.B.id;
    const uploader = t.seed.users.technicianB.id;
    const reviewer = { id: t.seed.users.analystB.id, name: await nameOf(t, 'analystB') };
    const settingsId = randomUUID();
    const plannedId = randomUUID();
    // The runs name a job and a settings version that are not written here: only the columns
    // the worklist reads matter, so the foreign keys are off while these rows go in.
    await t.dataSource.query('PRAGMA foreign_keys = OFF');
    await t.dataSource.transaction(async (tx) => {
      await tx.query(
        `INSERT INTO "planned_visit" ("id", "studyId", "name", "targetDay", "windowBeforeDays", "windowAfterDays", "position", "createdAt", "updatedAt") VALUES (?, ?, 'Month 3', 84, 7, 7, 0, ?, ?)`,
        [plannedId, studyId, '2025-09-01T00:00:00.000Z', '2025-09-01T00:00:00.000Z'],
      );
      for (let i = 0; i < VISITS; i++) {
        const participantId = randomUUID();
        const visitId = randomUUID();
        const at = new Date(Date.UTC(2026, 0, 1, 0, i)).toISOString();
        await tx.query(
          `INSERT INTO "participant" ("id", "studyId", "siteId", "code", "enrolmentDate", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, ?, ?, ?)`,
          [
            participantId,
            studyId,
            site.id,
            `BX-${String(i).padStart(4, '0')}`,
            i % 2 === 0 ? ENROLLED : null,
            at,
            at,
          ],
        );
        // Even visits are the planned "Month 3"; odd ones are unscheduled.
        await tx.query(
          `INSERT INTO "visit" ("id", "participantId", "studyId", "siteId", "label", "visitDate", "plannedVisitId", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, 'V1', '2026-01-01', ?, ?, ?)`,
          [visitId, participantId, studyId, site.id, i % 2 === 0 ? plannedId : null, at, at],
        );
        const runIds: string[] = [];
        for (const kind of ['resting', 'task'] as const) {
          const recordingId = randomUUID();
          const runId = randomUUID();
          runIds.push(`${kind}:${runId}`);
          await tx.query(
            `INSERT INTO "recording" ("id", "studyId", "siteId", "participantId", "visitId", "kind", "state", "checksumSha256", "sizeBytes", "uploadedById", "createdAt", "updatedAt", "latestRunId")
             VALUES (?, ?, ?, ?, ?, ?, 'ready', ?, 1, ?, ?, ?, ?)`,
            [
              recordingId,
              studyId,
              site.id,
              participantId,
              visitId,
              kind,
              randomUUID().replace(/-/g, '').padEnd(64, '0'),
              uploader,
              at,
              at,
              runId,
            ],
          );
          await tx.query(
            `INSERT INTO "analysis_run" ("id", "recordingId", "visitId", "participantId", "studyId", "siteId", "jobId", "kind", "trigger", "settingsId", "settingsVersion", "settingsJson", "codeVersion", "inputChecksumSha256", "bandLowHz", "bandHighHz", "bandSource", "roiDeltaFHz", "suggestsSlowing", "summaryJson", "series", "createdAt")
             VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'upload', ?, 1, '{}', 'test', ?, 8, 12, 'default', ?, ?, '{}', x'', ?)`,
            [
              runId,
              recordingId,
              visitId,
              participantId,
              studyId,
              site.id,
              randomUUID(),
              kind,
              settingsId,
              '0'.repeat(64),
              kind === 'task' ? -0.5 : null,
              kind === 'task' && i < SUGGESTING ? 1 : 0,
              at,
            ],
          );
        }
        if (i >= VISITS - REVIEWED) {
          const ids = runIds.sort();
          await tx.query(
            `INSERT INTO "visit_review" ("id", "visitId", "participantId", "studyId", "siteId", "reviewedById", "reviewedByName", "reviewedAt", "fingerprint", "runIdsJson") VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
            [
              randomUUID(),
              visitId,
              participantId,
              studyId,
              site.id,
              reviewer.id,
              reviewer.name,
              at,
              createHash('sha256').update(ids.join('\n')).digest('hex'),
              JSON.stringify(ids),
            ],
          );
        }
      }
    });
    await t.dataSource.query('PRAGMA foreign_keys = ON');
  }, 120_000);

  it('counts every visit, sorts oldest first by default, caps the items, and answers quickly', async () => {
    await worklist(t, 'analystB'); // warm the statement cache and the token
    const started = process.hrtime.bigint();
    const list = await worklist(t, 'analystB', { limit: 10 });
    const ms = Number(process.hrtime.bigint() - started) / 1e6;
    // Printed for docs/performance.md; the bound only catches a query per visit.
    console.log(`worklist over ${VISITS} visits (${VISITS * 2} runs): ${ms.toFixed(1)} ms`);
    expect(ms).toBeLessThan(2000);
    expect(section(list, 'unreviewed').total).toBe(VISITS - REVIEWED);
    expect(section(list, 'suggestions').total).toBe(SUGGESTING);
    expect(section(list, 'unreviewed').items).toHaveLength(10);
    const codes = section(list, 'unreviewed').items.map((i) => i.participantCode);
    expect(codes).toEqual([...Array(10).keys()].map((i) => `BX-${String(i).padStart(4, '0')}`));
    // Each item carries its visit's window status, from the same queries.
    const [planned, unscheduled] = section(list, 'unreviewed').items;
    expect(planned.schedule).toEqual({
      plannedVisitId: expect.any(String),
      plannedVisitName: 'Month 3',
      studyDay: 92,
      targetDay: 84,
      daysFromTarget: 8,
      window: 'late',
    });
    expect(unscheduled.schedule).toMatchObject({ plannedVisitId: null, window: 'unplanned' });
    expect(section(list, 'suggestions').items[0].schedule?.window).toBe('late');

    const newest = await worklist(t, 'analystB', {
      sort: 'newest',
      limit: 3,
      section: 'unreviewed',
    });
    expect(newest.sections.map((s) => s.key)).toEqual(['unreviewed']);
    const last = VISITS - REVIEWED - 1;
    expect(newest.sections[0].items.map((i) => i.participantCode)).toEqual(
      [last, last - 1, last - 2].map((i) => `BX-${String(i).padStart(4, '0')}`),
    );
    const paged = await worklist(t, 'analystB', { limit: 5, offset: 245, section: 'unreviewed' });
    expect(paged.sections[0].items.map((i) => i.participantCode)).toEqual([
      'BX-0245',
      'BX-0246',
      'BX-0247',
      'BX-0248',
      'BX-0249',
    ]);
  });
});
