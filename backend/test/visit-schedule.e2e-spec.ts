/**
 * A study's visit schedule and groups through the API: the admin writes them, everyone in the
 * study reads them; participants get an enrolment date and a group; a visit picks a planned
 * visit and carries its window status; the due list follows the caller's site scope.
 *
 * Expected calendar figures were counted by hand and checked with Python's datetime, e.g.
 * `date(2026, 1, 5) + timedelta(84)` = 2026-03-30 (outside Gyre).
 */
import request from 'supertest';
import type {
  AuditEntryView,
  DueListView,
  ParticipantView,
  PlannedVisitView,
  StudyGroupView,
  StudyView,
  VisitView,
} from '@gyre/shared';
import type { UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';
import { deleteAs, getAs, postAs } from './helpers/api-call';

const t = useTestApp();
const as = async (user: UserKey) => t.authHeader(user);
let studyA: string;
let studyB: string;
let baseline: PlannedVisitView;
let week12: PlannedVisitView;
let week26: PlannedVisitView;
let armA: StudyGroupView;
let armB: StudyGroupView;

beforeAll(async () => {
  studyA = t.seed.studies.A.id;
  studyB = t.seed.studies.B.id;
});

const plannedUrl = (study: string) => `/api/studies/${study}/planned-visits`;
const groupsUrl = (study: string) => `/api/studies/${study}/groups`;

describe('visit schedule and groups', () => {
  it('lets the admin write the schedule and groups, audited', async () => {
    /** A planned visit: name, target day and the window's days before and after it. */
    const post = async (name: string, targetDay: number, before: number, after: number) =>
      postAs(t, 'admin', plannedUrl(studyA), {
        name,
        targetDay,
        windowBeforeDays: before,
        windowAfterDays: after,
      });
    const week12Response = await post('Week 12', 84, 14, 14);
    expect(week12Response.status).toBe(201);
    week12 = week12Response.body as PlannedVisitView;
    expect(week12).toMatchObject({ studyId: studyA, name: 'Week 12', position: 0 });
    baseline = (await post('Baseline', 0, 0, 7)).body as PlannedVisitView;
    week26 = (await post('Week 26', 182, 14, 14)).body as PlannedVisitView;
    // Order it: baseline first.
    const moved = await request(t.url)
      .patch(`${plannedUrl(studyA)}/${baseline.id}`)
      .set(await as('admin'))
      .send({ position: 0 });
    expect(moved.status).toBe(200);
    await request(t.url)
      .patch(`${plannedUrl(studyA)}/${week12.id}`)
      .set(await as('admin'))
      .send({ position: 1 });
    const duplicate = await post('week 12', 90, 0, 0);
    expect(duplicate.status).toBe(409);
    expect(duplicate.body).toMatchObject({ code: 'PLANNED_VISIT_NAME_TAKEN' });
    expect(duplicate.body.message).toContain('week 12');
    const negative = await post('Week 1', -1, 0, 0);
    expect(negative.status).toBe(400);
    expect(negative.body.message).toMatch(/targetDay/);

    armA = (await postAs(t, 'admin', groupsUrl(studyA), { name: 'Arm A', description: 'Training' }))
      .body as StudyGroupView;
    armB = (await postAs(t, 'admin', groupsUrl(studyA), { name: 'Arm B' })).body as StudyGroupView;
    expect(armB).toMatchObject({ name: 'Arm B', description: '' });

    const audit = await getAs(t, 'admin', '/api/audit?objectType=PlannedVisit&pageSize=50');
    const entries = audit.body.items as AuditEntryView[];
    expect(entries.filter((e) => e.action === 'create')).toHaveLength(3);
    expect(entries.filter((e) => e.action === 'update')).toHaveLength(2);
    const groupAudit = await getAs(t, 'admin', '/api/audit?objectType=StudyGroup');
    expect(groupAudit.body.total).toBe(2);
  });

  it('lets everyone in the study read them, in order, and no one else; only the admin writes', async () => {
    for (const user of ['technician', 'analyst', 'monitor', 'coordinatorA2'] as UserKey[]) {
      const response = await request(t.url)
        .get(plannedUrl(studyA))
        .set(await as(user));
      expect({ user, status: response.status }).toEqual({ user, status: 200 });
      expect((response.body as PlannedVisitView[]).map((p) => p.name)).toEqual([
        'Baseline',
        'Week 12',
        'Week 26',
      ]);
    }
    for (const user of ['technicianB', 'analystB'] as UserKey[]) {
      const response = await request(t.url)
        .get(groupsUrl(studyA))
        .set(await as(user));
      expect({ user, status: response.status }).toEqual({ user, status: 404 });
    }
    for (const user of ['technician', 'analyst', 'monitor'] as UserKey[]) {
      const response = await request(t.url)
        .post(groupsUrl(studyA))
        .set(await as(user))
        .send({ name: `By ${user}` });
      expect({ user, status: response.status, code: response.body.code }).toEqual({
        user,
        status: 403,
        code: 'AUTH_FORBIDDEN',
      });
    }
    expect((await getAs(t, 'admin', groupsUrl(studyB))).body).toEqual([]);
  });

  it('stores the trend settings on the study and refuses bad ones', async () => {
    const patch = async (body: object) =>
      request(t.url)
        .patch(`/api/studies/${studyA}`)
        .set(await as('admin'))
        .send(body);
    const before = await getAs(t, 'analyst', `/api/studies/${studyA}`);
    expect(before.body).toMatchObject({ trendMinVisits: 3, trendMinSpanDays: 90 });
    const changed = await patch({ trendMinVisits: 4, trendMinSpanDays: 120 });
    expect(changed.status).toBe(200);
    expect(changed.body as StudyView).toMatchObject({ trendMinVisits: 4, trendMinSpanDays: 120 });
    const bad = await patch({ trendMinVisits: 1 });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/trendMinVisits/);
    await patch({ trendMinVisits: 3, trendMinSpanDays: 90 });
  });

  it('registers participants with an enrolment date and a group of the same study', async () => {
    const create = async (body: object, user: UserKey = 'technician') =>
      request(t.url)
        .post('/api/participants')
        .set(await as(user))
        .send(body);
    const created = await create({
      code: 'A1-0101',
      enrolmentDate: '2026-01-05',
      groupId: armA.id,
    });
    expect(created.status).toBe(201);
    expect(created.body as ParticipantView).toMatchObject({
      enrolmentDate: '2026-01-05',
      groupId: armA.id,
    });
    const impossible = await create({ code: 'A1-0102', enrolmentDate: '2025-02-29' });
    expect(impossible.status).toBe(400);
    expect(impossible.body).toMatchObject({ code: 'PARTICIPANT_BAD_DATE' });
    expect(impossible.body.message).toContain('2025-02-29');
    const written = await create({ code: 'A1-0103', enrolmentDate: '5 Jan 2026' });
    expect(written.status).toBe(400);
    expect(written.body.message).toMatch(/enrolmentDate/);
    const groupB = (await postAs(t, 'admin', groupsUrl(studyB), { name: 'Other arm' }))
      .body as StudyGroupView;
    const foreign = await create({ code: 'A1-0104', groupId: groupB.id });
    expect(foreign.status).toBe(400);
    expect(foreign.body).toMatchObject({ code: 'PARTICIPANT_GROUP_NOT_IN_STUDY' });
    // The seeded participant of site A1 had no enrolment date: now it gets one and a group.
    const updated = await request(t.url)
      .patch(`/api/participants/${t.seed.participants.A1.id}`)
      .set(await as('technician'))
      .send({ enrolmentDate: '2025-12-01', groupId: armB.id, reason: 'enrolled' });
    expect(updated.status).toBe(200);
    expect(updated.body).toMatchObject({
      code: 'A1-0001',
      enrolmentDate: '2025-12-01',
      groupId: armB.id,
    });
    const cleared = await request(t.url)
      .patch(`/api/participants/${t.seed.participants.A1.id}`)
      .set(await as('technician'))
      .send({ groupId: null });
    expect(cleared.body).toMatchObject({ enrolmentDate: '2025-12-01', groupId: null });
    await request(t.url)
      .patch(`/api/participants/${t.seed.participants.A1.id}`)
      .set(await as('technician'))
      .send({ groupId: armB.id });
  });

  it('registers visits on planned visits with their window status, one per planned visit', async () => {
    const participant = (await getAs(t, 'technician', '/api/participants?q=A1-0101')).body
      .items[0] as ParticipantView;
    const post = async (body: object) =>
      postAs(t, 'technician', '/api/visits', { participantId: participant.id, ...body });
    const missing = await post({ label: 'V1', visitDate: '2026-01-05' });
    expect(missing.status).toBe(400);
    expect(missing.body).toMatchObject({ code: 'VISIT_PLANNED_VISIT_REQUIRED' });
    expect(missing.body.message).toContain('Baseline, Week 12, Week 26');

    const first = await post({ plannedVisitId: baseline.id, visitDate: '2026-01-05' });
    expect(first.status).toBe(201);
    expect(first.body as VisitView).toMatchObject({
      label: 'Baseline',
      plannedVisitId: baseline.id,
      schedule: { studyDay: 0, targetDay: 0, daysFromTarget: 0, window: 'in' },
    });
    // 2026-01-05 + 84 days = 2026-03-30; + 14 = 2026-04-13 is the last day in window.
    const late = await post({ plannedVisitId: week12.id, visitDate: '2026-04-14' });
    expect(late.status).toBe(201);
    expect(late.body.schedule).toEqual({
      plannedVisitId: week12.id,
      plannedVisitName: 'Week 12',
      studyDay: 99,
      targetDay: 84,
      daysFromTarget: 15,
      window: 'late',
    });
    const again = await post({ plannedVisitId: week12.id, visitDate: '2026-04-01' });
    expect(again.status).toBe(409);
    expect(again.body).toMatchObject({ code: 'VISIT_PLANNED_VISIT_TAKEN' });
    expect(again.body.message).toContain('A1-0101 already has a visit on planned visit Week 12');
    const wrongLabel = await post({
      plannedVisitId: week26.id,
      label: 'Month 6',
      visitDate: '2026-07-06',
    });
    expect(wrongLabel.status).toBe(400);
    expect(wrongLabel.body).toMatchObject({ code: 'VISIT_LABEL_IS_PLANNED_NAME' });
    const unscheduled = await post({ unscheduled: true, label: 'Extra', visitDate: '2026-02-01' });
    expect(unscheduled.status).toBe(201);
    expect(unscheduled.body.schedule).toMatchObject({ studyDay: 27, window: 'unplanned' });
    const noLabel = await post({ unscheduled: true, visitDate: '2026-02-02' });
    expect(noLabel.status).toBe(400);
    expect(noLabel.body).toMatchObject({ code: 'VISIT_LABEL_REQUIRED' });

    // Moving the late visit's date into the window makes it "in" (2026-04-13 = day 98).
    const moved = await request(t.url)
      .patch(`/api/visits/${late.body.id}`)
      .set(await as('technician'))
      .send({ visitDate: '2026-04-13', reason: 'date typed wrong' });
    expect(moved.status).toBe(200);
    expect(moved.body.schedule).toMatchObject({ studyDay: 98, window: 'in' });

    // A visit whose participant has no enrolment date reads "unknown".
    const other = await postAs(t, 'technician', '/api/participants', { code: 'A1-0105' });
    const unknown = await postAs(t, 'technician', '/api/visits', {
      participantId: other.body.id,
      plannedVisitId: baseline.id,
      visitDate: '2026-02-02',
    });
    expect(unknown.status).toBe(201);
    expect(unknown.body.schedule).toMatchObject({ studyDay: null, window: 'unknown' });

    const list = await getAs(t, 'analyst', `/api/visits?participantId=${participant.id}`);
    expect((list.body.items as VisitView[]).map((v) => [v.label, v.schedule.window])).toEqual([
      ['Baseline', 'in'],
      ['Extra', 'unplanned'],
      ['Week 12', 'in'],
    ]);
  });

  it('refuses to delete a planned visit or group in use, naming what uses it', async () => {
    const plannedInUse = await deleteAs(t, 'admin', `${plannedUrl(studyA)}/${week12.id}`);
    expect(plannedInUse.status).toBe(409);
    expect(plannedInUse.body).toMatchObject({ code: 'PLANNED_VISIT_IN_USE' });
    expect(plannedInUse.body.message).toContain('A1-0101');
    const groupInUse = await deleteAs(t, 'admin', `${groupsUrl(studyA)}/${armA.id}`);
    expect(groupInUse.status).toBe(409);
    expect(groupInUse.body).toMatchObject({ code: 'STUDY_GROUP_IN_USE' });
    expect(groupInUse.body.message).toContain('A1-0101');
    const spare = (
      await postAs(t, 'admin', plannedUrl(studyA), {
        name: 'Spare',
        targetDay: 400,
        windowBeforeDays: 0,
        windowAfterDays: 0,
      })
    ).body as PlannedVisitView;
    const removed = await deleteAs(
      t,
      'admin',
      `${plannedUrl(studyA)}/${spare.id}?reason=not%20in%20the%20protocol`,
    );
    expect(removed.status).toBe(204);
    const audit = await getAs(t, 'admin', `/api/audit?objectType=PlannedVisit&action=delete`);
    expect(audit.body.items[0]).toMatchObject({
      objectId: spare.id,
      reason: 'not in the protocol',
    });
  });

  it("lists what is due at the caller's sites, on the day asked", async () => {
    // Site A2's participant, enrolled 2026-01-05 too, has had no visit at all.
    await request(t.url)
      .patch(`/api/participants/${t.seed.participants.A2.id}`)
      .set(await as('technicianA2'))
      .send({ enrolmentDate: '2026-01-05' });
    const due = async (user: UserKey, asOf: string) => {
      const response = await request(t.url)
        .get(`/api/studies/${studyA}/due?asOf=${asOf}`)
        .set(await as(user));
      expect(response.status).toBe(200);
      return response.body as DueListView;
    };
    // 2026-07-01: Week 26 (2026-01-05 + 182 = 2026-07-06) opened on 2026-06-22.
    const technician = await due('technician', '2026-07-01');
    expect(technician.asOf).toBe('2026-07-01');
    expect(
      technician.participants.map((p) => [p.participantCode, p.due.map((d) => d.plannedVisitName)]),
    ).toEqual([
      // A1-0001 (enrolled 2025-12-01) has no visit on the schedule: everything from baseline on.
      ['A1-0001', ['Baseline', 'Week 12', 'Week 26']],
      ['A1-0101', ['Week 26']],
    ]);
    expect(technician.participants[1].due[0]).toMatchObject({
      opens: '2026-06-22',
      target: '2026-07-06',
      closes: '2026-07-20',
      status: 'open',
      daysOverdue: 0,
    });
    // A1-0105 has no enrolment date: nothing can be due for them.
    expect(technician.withoutEnrolmentDate).toBe(1);
    const analyst = await due('analyst', '2026-07-01');
    expect(analyst.participants.map((p) => p.participantCode)).toEqual([
      'A1-0001',
      'A2-0001',
      'A1-0101',
    ]);
    const a2 = analyst.participants.find((p) => p.participantCode === 'A2-0001');
    // Baseline closed 2026-01-12 (day 7): 2026-07-01 is 170 days later.
    expect(a2?.due[0]).toMatchObject({ plannedVisitName: 'Baseline', daysOverdue: 170 });
    expect((await due('technicianA2', '2026-07-01')).participants).toHaveLength(1);
    const other = await getAs(t, 'technicianB', `/api/studies/${studyA}/due`);
    expect(other.status).toBe(404);
    const admin = await getAs(t, 'admin', `/api/studies/${studyA}/due`);
    expect(admin.status).toBe(403);
    const bad = await getAs(t, 'technician', `/api/studies/${studyA}/due?asOf=2026-02-30`);
    expect(bad.status).toBe(400);
    expect(bad.body.message).toContain('2026-02-30');
  });

  it('changes only the fields a PATCH gives (null keeps the value), audited with both sides', async () => {
    const created = (
      await postAs(t, 'admin', groupsUrl(studyB), { name: 'Arm P', description: 'Before' })
    ).body as StudyGroupView;
    const patch = async (body: object) =>
      request(t.url)
        .patch(`${groupsUrl(studyB)}/${created.id}`)
        .set(await as('admin'))
        .send(body);
    const described = await patch({ description: ' After ' });
    expect(described.status).toBe(200);
    expect(described.body).toMatchObject({ id: created.id, name: 'Arm P', description: 'After' });
    const renamed = await patch({ name: 'Arm Q', description: null });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ name: 'Arm Q', description: 'After', studyId: studyB });
    expect(await patch({ studyId: studyA })).toMatchObject({ status: 400 });
    // A day not written YYYY-MM-DD is refused by name, in a query and in a body alike.
    const badDay = await getAs(t, 'technician', '/api/visits', { from: '2026-3-1' });
    expect(badDay.status).toBe(400);
    expect(badDay.body.details.problems).toEqual([
      { field: 'from', reason: 'from must be a calendar date written YYYY-MM-DD' },
    ]);
    const audit = await getAs(t, 'admin', '/api/audit', {
      objectType: 'StudyGroup',
      action: 'update',
      order: 'desc',
    });
    const entry = (audit.body.items as AuditEntryView[]).find((e) => e.objectId === created.id);
    expect(entry).toMatchObject({
      before: { name: 'Arm P', description: 'After' },
      after: { name: 'Arm Q', description: 'After' },
    });
  });
});
