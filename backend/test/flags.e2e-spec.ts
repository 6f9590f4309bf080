/**
 * Slowing flags, draft reports and the participant trajectory through the API, on
 * generated recordings (see recordings-fixtures.ts).
 */
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { RecordingView, ReportView, TrajectoryView, VisitFlagView } from '@gyre/shared';
import { Visit } from '../src/visits/visit.entity';
import { useTestApp } from './helpers/test-app';
import { syntheticRestEdf, syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';
import { getAs, postAs } from './helpers/api-call';

describe('flags, reports and trajectory', () => {
  const t = useTestApp();
  let visit1: string;
  let visit2: string;

  async function computeVisit(visitId: string, peakHz: number, seed: number): Promise<void> {
    const rest = await upload(t, 'technician', visitId, {
      kind: 'resting',
      bytes: syntheticRestEdf({ peakHz, seed }),
    });
    const task = await upload(t, 'technician', visitId, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 60, seed }),
    });
    expect([rest.status, task.status]).toEqual([201, 201]);
    await waitForState(t, 'technician', (rest.body as RecordingView).id, ['ready']);
    await waitForState(t, 'technician', (task.body as RecordingView).id, ['ready']);
  }

  beforeAll(async () => {
    visit1 = t.seed.visits.A1.id;
    // A second, later visit of the same participant (generated test data).
    const at = new Date().toISOString();
    const second: Visit = {
      ...t.seed.visits.A1,
      id: randomUUID(),
      label: 'V2',
      visitDate: '2026-07-16',
      createdAt: at,
      updatedAt: at,
    };
    await t.dataSource.getRepository(Visit).insert(second);
    visit2 = second.id;
    await computeVisit(visit1, 10, 41);
    await computeVisit(visit2, 9, 42);
  }, 120_000);

  it("shows the computation's suggestion and never raises a flag by itself", async () => {
    const response = await getAs(t, 'analyst', `/api/visits/${visit1}/flag`);
    expect(response.status).toBe(200);
    const status = response.body as VisitFlagView;
    expect(status.current).toBeNull();
    expect(status.history).toEqual([]);
    // Generated −0.6 Hz dip, below the default −0.2 Hz threshold (docs/method.md §3).
    expect(status.suggestion).toMatchObject({ suggestsSlowing: true, flagThresholdHz: -0.2 });
    expect(status.suggestion?.roiDeltaFHz).toBeLessThan(-0.2);
    expect(await t.dataSource.query(`SELECT count(*) AS n FROM "flag"`)).toEqual([{ n: 0 }]);
  });

  it('refuses a reason shorter than 10 characters', async () => {
    for (const reason of ['', 'too short', '   nine c   ']) {
      const response = await postAs(t, 'analyst', `/api/visits/${visit1}/flag/raise`, { reason });
      expect(response.status).toBe(400);
      expect(response.body.message).toMatch(/reason must be longer than or equal to 10 characters/);
    }
  });

  it('raises and clears a flag with reasons, audited with before and after', async () => {
    const raised = await postAs(t, 'analyst', `/api/visits/${visit1}/flag/raise`, {
      reason: 'Consistent slowing on O1, O2 and Pz',
    });
    expect(raised.status).toBe(201);
    expect((raised.body as VisitFlagView).current).toMatchObject({
      state: 'raised',
      raiseReason: 'Consistent slowing on O1, O2 and Pz',
    });
    const twice = await postAs(t, 'analyst', `/api/visits/${visit1}/flag/raise`, {
      reason: 'Raising it a second time',
    });
    expect(twice.status).toBe(409);
    expect(twice.body.code).toBe('FLAG_ALREADY_RAISED');

    const trajectory = await getAs(
      t,
      'analyst',
      `/api/participants/${t.seed.participants.A1.id}/trajectory`,
    );
    expect((trajectory.body as TrajectoryView).visits.map((v) => v.flagged)).toEqual([true, false]);

    const cleared = await postAs(t, 'analyst', `/api/visits/${visit1}/flag/clear`, {
      reason: 'Artefact on review of the raw trace',
    });
    expect(cleared.status).toBe(201);
    const after = cleared.body as VisitFlagView;
    expect(after.current).toBeNull();
    expect(after.history[0]).toMatchObject({
      state: 'cleared',
      clearReason: 'Artefact on review of the raw trace',
    });
    const again = await postAs(t, 'analyst', `/api/visits/${visit1}/flag/clear`, {
      reason: 'Clearing it a second time',
    });
    expect(again.status).toBe(409);

    const entries = (await t.dataSource.query(
      `SELECT "action", "before", "after", "reason" FROM "audit_entry" WHERE "objectType" = 'Flag' ORDER BY "seq"`,
    )) as Array<{ action: string; before: string; after: string; reason: string }>;
    expect(entries.map((e) => [e.action, e.reason])).toEqual([
      ['raise', 'Consistent slowing on O1, O2 and Pz'],
      ['clear', 'Artefact on review of the raw trace'],
    ]);
    expect(JSON.parse(entries[0].before)).toEqual({ visitId: visit1, state: null });
    expect(JSON.parse(entries[0].after)).toMatchObject({
      state: 'raised',
      suggestion: { suggestsSlowing: true },
    });
    expect(JSON.parse(entries[1].before)).toMatchObject({ state: 'raised' });
    expect(JSON.parse(entries[1].after)).toMatchObject({ state: 'cleared' });
  });

  it('lists flags with a state filter', async () => {
    const response = await getAs(t, 'monitor', '/api/flags', { state: 'cleared' });
    expect(response.status).toBe(200);
    expect(response.body.total).toBe(1);
    const none = await getAs(t, 'monitor', '/api/flags', { state: 'raised' });
    expect(none.body.total).toBe(0);
  });

  it('keeps one draft report per computed visit, hidden from coordinators until signed', async () => {
    const report = await getAs(t, 'analyst', `/api/visits/${visit1}/report`);
    expect(report.status).toBe(200);
    expect((report.body as ReportView).state).toBe('draft');
    const list = await getAs(t, 'analyst', '/api/reports', { state: 'draft' });
    expect(list.body.total).toBe(2);
    const coordinator = await getAs(t, 'coordinator', `/api/visits/${visit1}/report`);
    expect(coordinator.status).toBe(404);
    const coordinatorList = await getAs(t, 'coordinator', '/api/reports');
    expect(coordinatorList.body.total).toBe(0);
  });

  it("gives the participant's trajectory: values per visit, change from the first, Theil–Sen slope per year", async () => {
    const response = await getAs(
      t,
      'monitor',
      `/api/participants/${t.seed.participants.A1.id}/trajectory`,
    );
    expect(response.status).toBe(200);
    const trajectory = response.body as TrajectoryView;
    expect(trajectory.visits.map((v) => [v.label, v.date])).toEqual([
      ['V1', '2026-01-15'],
      ['V2', '2026-07-16'],
    ]);
    const [v1, v2] = trajectory.visits;
    // Generated truth: resting peaks at 10 and 9 Hz.
    expect(v1.pafHz).toBeCloseTo(10, 0);
    expect(v2.pafHz).toBeCloseTo(9, 0);
    expect(v1.pafChangeHz).toBe(0);
    expect(v2.pafChangeHz).toBeCloseTo((v2.pafHz ?? 0) - (v1.pafHz ?? 0), 12);
    expect(v2.deltaFHz).toBeLessThan(-0.5);
    // The study's rule (3 visits over 90 days) gives no slope from two visits, and says why.
    expect(trajectory.trendRule).toEqual({ minVisits: 3, minSpanDays: 90 });
    expect(trajectory.trends.paf).toEqual({
      slopeHzPerYear: null,
      reason: 'too-few-visits',
      visits: 2,
      spanDays: 182,
    });
    expect(trajectory.slopesHzPerYear.paf).toBeNull();
    // With the study's rule at two visits, the slope appears.
    const studyId = t.seed.studies.A.id;
    const admin = await t.authHeader('admin');
    await request(t.url)
      .patch(`/api/studies/${studyId}`)
      .set(admin)
      .send({ trendMinVisits: 2 })
      .expect(200);
    const allowed = (
      await getAs(t, 'monitor', `/api/participants/${t.seed.participants.A1.id}/trajectory`)
    ).body as TrajectoryView;
    await request(t.url)
      .patch(`/api/studies/${studyId}`)
      .set(admin)
      .send({ trendMinVisits: 3 })
      .expect(200);
    expect(allowed.trends.paf.reason).toBeNull();
    // Two points: the Theil–Sen slope is the slope of the line through them;
    // 2026-01-15 → 2026-07-16 is 182 days (calendar), years of 365.25 days.
    const years = 182 / 365.25;
    expect(allowed.slopesHzPerYear.paf).toBeCloseTo(
      ((v2.pafHz ?? 0) - (v1.pafHz ?? 0)) / years,
      10,
    );
    expect(allowed.trends.cog.slopeHzPerYear).toBeCloseTo(
      ((v2.cogHz ?? 0) - (v1.cogHz ?? 0)) / years,
      10,
    );
    expect(trajectory.visits.every((v) => !v.flagged)).toBe(true);
  });
});
