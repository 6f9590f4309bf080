/**
 * Blinded review through the API on a real SQLite file: the study setting (admin, audited with
 * a reason), what a blinded analyst's worklist and Review answers hold (asserted on the raw
 * JSON text, so nothing hidden can hide in a field the assertions did not name), the decision
 * that unblinds a visit for that analyst alone, its audit entry and the monitor's Ledger.
 * The rules under test are Gyre's own (docs/user-guide.md, "Blinded review"); "the answer holds
 * none of these strings" is common practice for checking that a field never leaves the server.
 */
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type {
  AuditEntryView,
  FlagView,
  Page,
  RecordingView,
  ReportRevisionView,
  ReportSignOffView,
  StudyView,
  VisitAnalysisOverrideView,
  VisitBlindingView,
  VisitFlagView,
  VisitReviewStateView,
  WorklistItem,
  WorklistView,
} from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { auditEntries } from './helpers/audit-entries';
import { binaryBody } from './helpers/binary-body';
import { countOf } from './helpers/row-count';
import { SEED_PASSWORD, type UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';
import { syntheticRestEdf, upload, waitForState } from './recordings-fixtures';

/** Invented names and dates that only the hidden fields carry (none occurs anywhere else). */
const PLANNED_NAME = 'Quokka follow-up';
const GROUP_NAME = 'Heliotrope arm';
const VISIT_DATE = '2026-01-15';
const OTHER_VISIT_DATE = '2025-07-21';
const ENROLMENT_DATE = '2025-07-20';
const CODE_PATTERN = /^B-[2-9A-HJKMNP-Z]{4}$/;

type Header = { Authorization: string };

describe('blinded review', () => {
  const t = useTestApp();
  let visitId: string;
  let otherVisitId: string;
  let participantCode: string;
  let restId: string;
  /** A second analyst of study A, made for this test (the seed has one per study). */
  let secondAnalyst: Header;
  /** The report revision the first analyst signs once the visit is unblinded for them. */
  let signedRevisionId: string;

  const as = async (user: UserKey): Promise<Header> => t.authHeader(user);

  async function get(header: Header, path: string, status = 200): Promise<request.Response> {
    const response = await request(t.url).get(path).set(header);
    expect({ path, status: response.status }).toEqual({ path, status });
    return response;
  }

  /** The caller's blinding decision on a visit (`POST /api/visits/:visitId/blinding/decision`). */
  function decide(
    header: Header,
    body: { decision: string; reason: string },
    visit = visitId,
  ): request.Test {
    return request(t.url).post(`/api/visits/${visit}/blinding/decision`).set(header).send(body);
  }

  async function worklist(header: Header): Promise<WorklistView> {
    return (await get(header, '/api/worklist')).body as WorklistView;
  }

  /** The ids of the signed revisions the caller lists for the visit. */
  async function revisionIds(header: Header): Promise<string[]> {
    const list = (await get(header, `/api/report-revisions?visitId=${visitId}`))
      .body as Page<ReportRevisionView>;
    return list.items.map((r) => r.id);
  }

  const itemsOf = (list: WorklistView): WorklistItem[] =>
    list.sections.flatMap((s) => s.items).filter((i) => i.visitId === visitId);

  /** Dates every time stamp of the visit's rows in `tables` on the day of the visit. */
  async function stampOnTheDay(tables: string[]): Promise<void> {
    const onTheDay = `${VISIT_DATE}T09:30:00.000Z`;
    for (const table of tables) {
      const columns = (
        (await t.dataSource.query(`PRAGMA table_info("${table}")`)) as Array<{ name: string }>
      ).map((c) => c.name);
      const stamps = columns.filter((c) => c.endsWith('At'));
      const key = columns.includes('visitId') ? 'visitId' : 'recordingId';
      const ids = key === 'visitId' ? [visitId] : [restId];
      if (stamps.length === 0 || !columns.includes(key)) continue;
      await t.dataSource.query(
        `UPDATE "${table}" SET ${stamps.map((c) => `"${c}" = CASE WHEN "${c}" IS NULL THEN NULL ELSE ? END`).join(', ')} WHERE "${key}" = ?`,
        [...stamps.map(() => onTheDay), ...ids],
      );
    }
  }

  /** Another analyst of study A: the seeded analyst's row under a new id and `email`, signed in. */
  async function copiedAnalyst(email: string): Promise<Header> {
    const id = randomUUID();
    await t.dataSource.query(
      `INSERT INTO "user" ("id", "email", "name", "role", "studyId", "siteId", "passwordHash", "state",
         "failedSignIns", "lockedUntil", "lastSignInAt", "passwordChangedAt", "createdAt", "updatedAt")
       SELECT ?, ?, "name" || ' ' || ?, "role", "studyId", "siteId", "passwordHash", "state",
         "failedSignIns", "lockedUntil", "lastSignInAt", "passwordChangedAt", "createdAt", "updatedAt"
       FROM "user" WHERE "id" = ?`,
      [id, email, email.split('.')[0], t.seed.users.analyst.id],
    );
    const signIn = await request(t.url)
      .post('/api/auth/sign-in')
      .send({ email, password: SEED_PASSWORD });
    expect(signIn.status).toBe(200);
    return { Authorization: `Bearer ${(signIn.body as { accessToken: string }).accessToken}` };
  }

  async function setBlinded(on: boolean, reason?: string): Promise<request.Response> {
    return request(t.url)
      .patch(`/api/studies/${t.seed.studies.A.id}`)
      .set(await as('admin'))
      .send(reason === undefined ? { blindedReview: on } : { blindedReview: on, reason });
  }

  /** The raw text of every answer Review reads for the visit, as the analyst gets them. */
  async function reviewAnswers(header: Header): Promise<string> {
    const paths = [
      `/api/worklist`,
      `/api/visits/${visitId}/blinding`,
      `/api/recordings?visitId=${visitId}`,
      `/api/recordings/${restId}`,
      `/api/recordings/${restId}/results`,
      `/api/visits/${visitId}/flag`,
      `/api/visits/${visitId}/review`,
      `/api/visits/${visitId}/report`,
      `/api/visits?participantId=${t.seed.participants.A1.id}`,
    ];
    const texts: string[] = [];
    for (const path of paths) texts.push((await get(header, path)).text);
    return texts.join('\n');
  }

  /** Everything blinded review hides of the visit (participantCode and otherVisitId once set). */
  const hiddenFacts = (): string[] => [
    VISIT_DATE,
    OTHER_VISIT_DATE,
    ENROLMENT_DATE,
    PLANNED_NAME,
    GROUP_NAME,
    participantCode,
    otherVisitId,
    'upload-2026-01-15',
  ];

  function expectNothingHidden(text: string): void {
    for (const hidden of hiddenFacts()) {
      expect({ hidden, found: text.includes(hidden) }).toEqual({ hidden, found: false });
    }
  }

  /**
   * Every GET route of the OpenAPI document the app serves, with each path parameter filled
   * with the blinded visit's ids (its visit, recording, participant, site, study, report) and,
   * where a route takes one, each id as a query filter too: the raw text of each answer as
   * `header` gets it, whatever the status. Binary answers are read as bytes; a zip is refused
   * outright by the assertion (its compressed text could hide anything).
   */
  async function sweep(header: Header): Promise<Array<{ path: string; text: string }>> {
    const doc = (await request(t.url).get('/api/docs/openapi.json')).body as {
      paths: Record<string, { get?: { parameters?: Array<{ name: string; in: string }> } }>;
    };
    const [report] = (await t.dataSource.query(`SELECT "id" FROM "report" WHERE "visitId" = ?`, [
      visitId,
    ])) as Array<{ id: string }>;
    const participant = t.seed.participants.A1;
    const ids: Record<string, string> = {
      visitId,
      recordingId: restId,
      participantId: participant.id,
      siteId: participant.siteId,
      studyId: t.seed.studies.A.id,
      reportId: report.id,
      revisionId: randomUUID(),
    };
    /** `{id}` by the resource the path names. */
    const idOf: Record<string, string> = {
      visits: visitId,
      participants: participant.id,
      sites: participant.siteId,
      studies: t.seed.studies.A.id,
      users: t.seed.users.analyst.id,
      recordings: restId,
    };
    const answers: Array<{ path: string; text: string }> = [];
    for (const [template, item] of Object.entries(doc.paths)) {
      if (item.get === undefined || template.startsWith('/api/worker/')) continue;
      const path = template.replace(/\{(\w+)\}/g, (_m, name: string) => {
        const resource = /\/(\w[\w-]*)\/\{id\}/.exec(template)?.[1] ?? '';
        return name === 'id' ? idOf[resource] : (ids[name] ?? randomUUID());
      });
      const filters = (item.get.parameters ?? [])
        .filter((p) => p.in === 'query' && ids[p.name] !== undefined)
        .map((p) => `${p.name}=${ids[p.name]}`);
      for (const query of ['', ...filters]) {
        const url = query === '' ? path : `${path}?${query}`;
        const response = await request(t.url)
          .get(url)
          .set(header)
          .buffer(true)
          .parse(binaryBody)
          .timeout(20_000);
        const type = String(response.headers['content-type'] ?? '');
        if (response.status === 200 && type.includes('zip')) {
          answers.push({ path: url, text: 'a zip archive was delivered' });
          continue;
        }
        const body = response.body as Buffer;
        answers.push({ path: url, text: body.toString('utf8') });
      }
    }
    return answers;
  }

  /**
   * The study's design (its planned visits and groups, by name) is no fact about any visit:
   * those two answers may name them, and must hold nothing else of the list.
   */
  const DESIGN = /\/studies\/[^/]+\/(planned-visits|groups)$/;

  function expectNoneHolds(
    answers: Array<{ path: string; text: string }>,
    hidden: readonly string[],
  ): void {
    const found = answers.flatMap(({ path, text }) =>
      [...hidden, 'a zip archive was delivered']
        .filter((h) => !(DESIGN.test(path) && (h === PLANNED_NAME || h === GROUP_NAME)))
        .filter((h) => text.includes(h))
        .map((h) => `${path} holds ${h}`),
    );
    expect(found).toEqual([]);
  }

  beforeAll(async () => {
    const study = t.seed.studies.A;
    const participant = t.seed.participants.A1;
    visitId = t.seed.visits.A1.id;
    participantCode = participant.code;
    const at = new Date().toISOString();
    // The study's schedule and arm, and a second visit of the participant, written straight in.
    const plannedId = randomUUID();
    const groupId = randomUUID();
    otherVisitId = randomUUID();
    await t.dataSource.query(
      `INSERT INTO "planned_visit" ("id","studyId","name","targetDay","windowBeforeDays","windowAfterDays","position","createdAt","updatedAt")
       VALUES (?,?,?,?,?,?,?,?,?)`,
      [plannedId, study.id, PLANNED_NAME, 180, 14, 14, 1, at, at],
    );
    await t.dataSource.query(
      `INSERT INTO "study_group" ("id","studyId","name","description","createdAt","updatedAt") VALUES (?,?,?,?,?,?)`,
      [groupId, study.id, GROUP_NAME, '', at, at],
    );
    await t.dataSource.query(
      `UPDATE "participant" SET "groupId" = ?, "enrolmentDate" = ? WHERE "id" = ?`,
      [groupId, ENROLMENT_DATE, participant.id],
    );
    await t.dataSource.query(
      `UPDATE "visit" SET "plannedVisitId" = ?, "label" = ? WHERE "id" = ?`,
      [plannedId, PLANNED_NAME, visitId],
    );
    await t.dataSource.query(
      `INSERT INTO "visit" ("id","participantId","studyId","siteId","label","plannedVisitId","visitDate","createdAt","updatedAt")
       VALUES (?,?,?,?,?,?,?,?,?)`,
      [
        otherVisitId,
        participant.id,
        study.id,
        participant.siteId,
        'Baseline',
        null,
        OTHER_VISIT_DATE,
        at,
        at,
      ],
    );
    // A second analyst of study A.
    secondAnalyst = await copiedAnalyst('second.analyst@example.org');
    // One computed recording, uploaded under a file name that carries the visit date.
    const rest = await upload(t, 'technician', visitId, {
      kind: 'resting',
      bytes: syntheticRestEdf({ peakHz: 10, seed: 7 }),
      fileName: 'upload-2026-01-15.edf',
    });
    expect(rest.status).toBe(201);
    restId = (rest.body as RecordingView).id;
    await waitForState(t, 'technician', restId, ['ready']);
    await t.computationsIdle();
    // The recording was uploaded and computed on the day of the visit, as it would be at a site:
    // every time stamp of the visit's rows then carries the visit date.
    await stampOnTheDay(['recording', 'job', 'analysis_run', 'report', 'flag', 'visit_review']);
  }, 120_000);

  it('is off by default: the analyst sees the visit as it is', async () => {
    const study = (await get(await as('analyst'), `/api/studies/${t.seed.studies.A.id}`))
      .body as StudyView;
    expect(study.blindedReview).toBe(false);
    const [item] = itemsOf(await worklist(await as('analyst')));
    expect(item).toMatchObject({
      participantCode,
      visitLabel: PLANNED_NAME,
      visitDate: VISIT_DATE,
      blindCode: null,
    });
    const blinding = (await get(await as('analyst'), `/api/visits/${visitId}/blinding`))
      .body as VisitBlindingView;
    expect(blinding).toEqual({
      visitId,
      studyId: t.seed.studies.A.id,
      code: null,
      blinded: false,
      decision: null,
    });
    const recording = (await get(await as('analyst'), `/api/recordings/${restId}`))
      .body as RecordingView;
    expect(recording.fileName).toBe('upload-2026-01-15.edf');
  });

  it('is switched by an admin only, with a reason, and audited', async () => {
    const noReason = await setBlinded(true);
    expect(noReason.status).toBe(400);
    expect(JSON.stringify(noReason.body)).toMatch(/reason/);
    const byAnalyst = await request(t.url)
      .patch(`/api/studies/${t.seed.studies.A.id}`)
      .set(await as('analyst'))
      .send({ blindedReview: true, reason: 'Analysts should not know the arm' });
    expect(byAnalyst.status).toBe(403);
    const on = await setBlinded(true, 'Analysts should not know the arm');
    expect(on.status).toBe(200);
    expect((on.body as StudyView).blindedReview).toBe(true);
    const [entry] = (await auditEntries(t, 'monitor', { objectType: 'Study', action: 'update' }))
      .items;
    expect(entry).toMatchObject({
      objectId: t.seed.studies.A.id,
      reason: 'Analysts should not know the arm',
      before: expect.objectContaining({ blindedReview: false }) as unknown,
      after: expect.objectContaining({ blindedReview: true }) as unknown,
    });
  });

  it("hides the visit's date, planned visit, group and other visits from the analyst", async () => {
    const analyst = await as('analyst');
    const text = await reviewAnswers(analyst);
    expectNothingHidden(text);
    const [item] = itemsOf(await worklist(analyst));
    expect(item.blindCode).toMatch(CODE_PATTERN);
    expect(item).toMatchObject({
      visitLabel: item.blindCode,
      visitDate: null,
      schedule: null,
      participantId: null,
      participantCode: null,
      link: { screen: 'review', visitId, participantId: null },
    });
    // The participant's list row and course hold none of the visits the analyst has not decided on.
    const participantId = t.seed.participants.A1.id;
    for (const path of ['/api/participants', `/api/participants/${participantId}/trajectory`]) {
      const answer = (await get(analyst, path)).text;
      for (const hidden of [VISIT_DATE, OTHER_VISIT_DATE, PLANNED_NAME, visitId, otherVisitId]) {
        expect({ path, hidden, found: answer.includes(hidden) }).toEqual({
          path,
          hidden,
          found: false,
        });
      }
    }
    // The visit's own view and the sign-off flow (which shows everything) are refused.
    const visit = await get(analyst, `/api/visits/${visitId}`, 403);
    expect((visit.body as { code: string }).code).toBe('BLINDING_VISIT_BLINDED');
    await get(analyst, `/api/visits/${visitId}/report/sign-off`, 403);
    // The code is stored: the same on every read, and the same for every analyst.
    const again = itemsOf(await worklist(analyst))[0];
    const second = itemsOf(await worklist(secondAnalyst))[0];
    expect([again.blindCode, second.blindCode]).toEqual([item.blindCode, item.blindCode]);
    const [stored] = (await t.dataSource.query(
      `SELECT "code" FROM "visit_blind_code" WHERE "visitId" = ?`,
      [visitId],
    )) as Array<{ code: string }>;
    expect(stored.code).toBe(item.blindCode);
  });

  it('leaves nothing in any GET answer that ties the blinded visit to its facts', async () => {
    const answers = await sweep(await as('analyst'));
    expect(answers.length).toBeGreaterThan(60);
    expectNoneHolds(answers, hiddenFacts());
    // The study-wide surfaces say why they are closed and to whom; other roles keep them.
    const studyId = t.seed.studies.A.id;
    for (const path of [
      `/api/studies/${studyId}/overview`,
      `/api/studies/${studyId}/results.csv`,
      `/api/studies/${studyId}/conditions.csv`,
      `/api/studies/${studyId}/export.zip`,
    ]) {
      const refused = await get(await as('analyst'), path, 403);
      expect(refused.body as { code: string; message: string }).toMatchObject({
        code: 'BLINDING_STUDY_CLOSED',
        message: expect.stringMatching(
          /^Blinded review is on for this study: .* closed to analysts/,
        ) as unknown,
      });
      await get(await as('monitor'), path);
    }
    const participant = await get(
      await as('analyst'),
      `/api/participants/${t.seed.participants.A1.id}`,
      403,
    );
    expect((participant.body as { code: string }).code).toBe('BLINDING_PARTICIPANT_BLINDED');
    // Times of the visit's rows are counted from its first upload, not dated.
    const recording = (await get(await as('analyst'), `/api/recordings/${restId}`))
      .body as RecordingView;
    expect([recording.createdAt, recording.participantId]).toEqual([
      '1970-01-01T00:00:00.000Z',
      null,
    ]);
  }, 120_000);

  it('never blinds a technician or a monitor', async () => {
    const monitor = await worklist(await as('monitor'));
    expect(itemsOf(monitor)[0]).toMatchObject({
      participantCode,
      visitDate: VISIT_DATE,
      blindCode: null,
    });
    const visit = await get(await as('monitor'), `/api/visits/${visitId}`);
    expect(visit.text).toContain(VISIT_DATE);
    const technicianVisit = await get(await as('technician'), `/api/visits/${visitId}`);
    expect(technicianVisit.text).toContain(PLANNED_NAME);
    const recording = (await get(await as('technician'), `/api/recordings/${restId}`))
      .body as RecordingView;
    expect(recording.fileName).toBe('upload-2026-01-15.edf');
  });

  it('refuses a decision without a reason, and from a monitor', async () => {
    const short = await decide(await as('analyst'), { decision: 'noFlag', reason: 'fine' });
    expect(short.status).toBe(400);
    const wrong = await decide(await as('analyst'), {
      decision: 'maybe',
      reason: 'Nothing here to flag at all',
    });
    expect(wrong.status).toBe(400);
    const monitor = await decide(await as('monitor'), {
      decision: 'noFlag',
      reason: 'Nothing here to flag at all',
    });
    expect(monitor.status).toBe(403);
    expect(await countOf(t, 'visit_unblinding')).toBe(0);
  });

  it('unblinds the visit for the deciding analyst only, audited, listed in the Ledger', async () => {
    const analyst = await as('analyst');
    const code = itemsOf(await worklist(analyst))[0].blindCode;
    const reason = 'PAF steady, no slowing to flag';
    const decided = await decide(analyst, { decision: 'noFlag', reason });
    expect(decided.status).toBe(201);
    expect(decided.body as VisitBlindingView).toMatchObject({
      visitId,
      code,
      blinded: false,
      decision: { decision: 'noFlag', reason, flagId: null },
    });
    // That analyst now sees everything; the other analyst still sees the code only.
    const [item] = itemsOf(await worklist(analyst));
    expect(item).toMatchObject({
      participantCode,
      visitLabel: PLANNED_NAME,
      visitDate: VISIT_DATE,
      blindCode: null,
    });
    expect((await get(analyst, `/api/visits/${visitId}`)).text).toContain(VISIT_DATE);
    expect(
      (await get(analyst, `/api/visits?participantId=${t.seed.participants.A1.id}`)).text,
    ).toContain(visitId);
    await get(analyst, `/api/visits/${visitId}/report/sign-off`);
    const course = await get(analyst, `/api/participants/${t.seed.participants.A1.id}/trajectory`);
    expect(course.text).toContain(visitId);
    expect(course.text).not.toContain(otherVisitId);
    expectNothingHidden(await reviewAnswers(secondAnalyst));
    // A second decision is refused and writes nothing.
    const twice = await decide(analyst, { decision: 'flag', reason });
    expect(twice.status).toBe(409);
    expect(await countOf(t, 'flag')).toBe(0);
    // The audit row, and the monitor's Ledger answer with it.
    const rows = (await t.dataSource.query(
      `SELECT "actorId", "objectType", "objectId", "reason" FROM "audit_entry" WHERE "action" = 'unblind'`,
    )) as Array<Record<string, string>>;
    expect(rows).toEqual([
      { actorId: t.seed.users.analyst.id, objectType: 'Visit', objectId: visitId, reason },
    ]);
    const ledger = await auditEntries(t, 'monitor', { action: 'unblind' });
    expect(ledger.items).toHaveLength(1);
    const entry: AuditEntryView = ledger.items[0];
    expect(entry).toMatchObject({
      actorId: t.seed.users.analyst.id,
      objectType: 'Visit',
      objectId: visitId,
      reason,
      after: expect.objectContaining({ code, blinded: false, decision: 'noFlag' }) as unknown,
    });
  });

  it('after the decision, shows that visit in every GET answer but still none of the others', async () => {
    const answers = await sweep(await as('analyst'));
    expect(answers.some((a) => a.text.includes(PLANNED_NAME))).toBe(true);
    expect(answers.some((a) => a.text.includes(participantCode))).toBe(true);
    expectNoneHolds(answers, [OTHER_VISIT_DATE, otherVisitId]);
    await get(await as('analyst'), `/api/participants/${t.seed.participants.A1.id}`);
    const recording = (await get(await as('analyst'), `/api/recordings/${restId}`))
      .body as RecordingView;
    expect(recording.createdAt).toBe(`${VISIT_DATE}T09:30:00.000Z`);
    // The second analyst has decided nothing yet: still nothing of the visit.
    expectNoneHolds(await sweep(secondAnalyst), [
      VISIT_DATE,
      PLANNED_NAME,
      GROUP_NAME,
      participantCode,
      otherVisitId,
    ]);
  }, 120_000);

  it('lists a revision signed by the deciding analyst to no analyst still blinded to its visit', async () => {
    const analyst = await as('analyst');
    const { draftFingerprint } = (await get(analyst, `/api/visits/${visitId}/report/sign-off`))
      .body as ReportSignOffView;
    const signed = await request(t.url)
      .post(`/api/visits/${visitId}/report/sign`)
      .set(analyst)
      .send({ password: SEED_PASSWORD, meaning: SIGNATURE_MEANING, fingerprint: draftFingerprint });
    expect(signed.status).toBe(201);
    signedRevisionId = (signed.body as ReportRevisionView).id;
    // The deciding analyst lists it; the second analyst, blinded still, gets neither the row nor
    // its count, with or without the visit as filter.
    expect(await revisionIds(analyst)).toEqual([signedRevisionId]);
    for (const query of ['', `?visitId=${visitId}`]) {
      const list = (await get(secondAnalyst, `/api/report-revisions${query}`))
        .body as Page<ReportRevisionView>;
      expect({ query, items: list.items, total: list.total }).toEqual({
        query,
        items: [],
        total: 0,
      });
    }
  });

  it('raises the flag with a "flag" decision, in the same transaction as the unblinding', async () => {
    const decided = await decide(secondAnalyst, {
      decision: 'flag',
      reason: 'ROI Δf below the threshold, CI excludes 0',
    });
    expect(decided.status).toBe(201);
    const view = decided.body as VisitBlindingView;
    expect(view.blinded).toBe(false);
    const flags = (await t.dataSource.query(
      `SELECT "id", "raiseReason" FROM "flag" WHERE "visitId" = ?`,
      [visitId],
    )) as Array<{ id: string; raiseReason: string }>;
    expect(flags).toEqual([
      { id: view.decision?.flagId, raiseReason: 'ROI Δf below the threshold, CI excludes 0' },
    ]);
    const actions = (await auditEntries(t, 'monitor', { objectId: flags[0].id })).items.map(
      (e) => e.action,
    );
    expect(actions).toEqual(['raise']);
    // Decided: the revision the first analyst signed is in this analyst's list now.
    expect(await revisionIds(secondAnalyst)).toEqual([signedRevisionId]);
  });

  it("shows a still-blinded analyst colleagues' flag, review mark and override by the visit's clock", async () => {
    // A third analyst, blinded still; the first analyst overrides the band and marks the visit
    // reviewed; the flag is the second analyst's.
    const third = await copiedAnalyst('third.analyst@example.org');
    const analyst = await as('analyst');
    const override = await request(t.url)
      .put(`/api/visits/${visitId}/analysis-override`)
      .set(analyst)
      .send({
        roi: null,
        bandHz: [8, 12.5],
        onsetLabel: null,
        reason: 'Band widened for this session',
      });
    expect(override.status).toBe(200);
    await t.computationsIdle();
    const state = (await get(analyst, `/api/visits/${visitId}/review`))
      .body as VisitReviewStateView;
    const marked = await request(t.url)
      .post(`/api/visits/${visitId}/review`)
      .set(analyst)
      .send({ fingerprint: state.currentFingerprint });
    expect(marked.status).toBe(201);
    // The flag dated on the day of the visit (review marks and overrides are never changed).
    await stampOnTheDay(['flag']);
    const flagPath = `/api/visits/${visitId}/flag`;
    const acts = [
      flagPath,
      `/api/visits/${visitId}/review`,
      `/api/visits/${visitId}/analysis-override`,
      '/api/flags',
    ];
    const shown: string[] = [];
    for (const path of acts) shown.push((await get(third, path)).text);
    expectNothingHidden(shown.join('\n') + (await reviewAnswers(third)));
    // Blinded: the acts keep their order, counted from the first upload; the analyst who decided
    // sees the dates.
    const blindedFlag = (await get(third, flagPath)).body as VisitFlagView;
    expect(blindedFlag.current?.raisedAt).toMatch(/^1970-01-01T/);
    const openFlag = (await get(analyst, flagPath)).body as VisitFlagView;
    expect(openFlag.current?.raisedAt).toBe(`${VISIT_DATE}T09:30:00.000Z`);
    const listed = (await get(third, `/api/flags`)).body as Page<FlagView>;
    expect(listed.items.find((f) => f.visitId === visitId)?.raisedAt).toMatch(/^1970-01-01T/);
    const reviewOf = async (header: Header): Promise<string | undefined> =>
      ((await get(header, `/api/visits/${visitId}/review`)).body as VisitReviewStateView).latest
        ?.reviewedAt;
    expect(await reviewOf(third)).toMatch(/^1970-/);
    expect(await reviewOf(analyst)).not.toMatch(/^1970-/);
    const overrideOf = async (header: Header): Promise<string | null> =>
      (
        (await get(header, `/api/visits/${visitId}/analysis-override`))
          .body as VisitAnalysisOverrideView
      ).updatedAt;
    expect(await overrideOf(third)).toMatch(/^1970-/);
    expect(await overrideOf(analyst)).not.toMatch(/^1970-/);
  });

  it('shows everything as before once the setting is off', async () => {
    expect((await setBlinded(false, 'Blinding period of the trial ended')).status).toBe(200);
    const blinding = (await get(secondAnalyst, `/api/visits/${visitId}/blinding`))
      .body as VisitBlindingView;
    expect(blinding).toMatchObject({ code: null, blinded: false });
    const [item] = itemsOf(await worklist(secondAnalyst));
    expect(item).toMatchObject({ participantCode, visitDate: VISIT_DATE, blindCode: null });
    expect((await get(secondAnalyst, `/api/visits/${otherVisitId}`)).text).toContain(
      OTHER_VISIT_DATE,
    );
    const decision = await decide(
      secondAnalyst,
      { decision: 'noFlag', reason: 'Nothing here to flag at all' },
      otherVisitId,
    );
    expect(decision.status).toBe(409);
  });
});
