/**
 * A site's calibration run through the API on a real SQLite file: the generated recording is
 * computed by the job queue and the worker pool, compared with its known answers (by
 * construction: a 10.0 Hz resting peak, a −0.5 Hz dip from +0.2 to +0.8 s after each onset;
 * docs/method.md, "Calibration run"), stored, audited, and never seen by study lists.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { AuditEntryView, CalibrationRunView, Page } from '@gyre/shared';
import { DEFAULT_ANALYSIS_SETTINGS } from '../src/signal/pipeline/analysis-settings';
import type { UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';
import { getAs, postAs } from './helpers/api-call';

describe('calibration runs', () => {
  const t = useTestApp();
  let studyA: string;
  let siteA1: string;
  beforeAll(async () => {
    studyA = t.seed.studies.A.id;
    siteA1 = t.seed.sites.A1.id;
  });

  /** Until no run of site A1 waits or computes (asked through the API, as the client does). */
  async function calibrationIdle(): Promise<void> {
    for (let i = 0; i < 600; i++) {
      const runs = await runsOf('admin');
      if (runs.every((run) => run.state === 'passed' || run.state === 'failed')) return;
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
    throw new Error('Calibration runs still active after 120 s');
  }

  /** What study screens and exports answer; a calibration run must change none of it. */
  async function studyViews(): Promise<unknown[]> {
    const reads: Array<[UserKey, string]> = [
      ['analyst', '/api/participants'],
      ['analyst', '/api/visits'],
      ['analyst', '/api/recordings'],
      ['analyst', '/api/reports'],
      ['analyst', '/api/worklist'],
      ['monitor', '/api/worklist'],
      ['technician', '/api/worklist'],
      ['analyst', `/api/studies/${studyA}/overview`],
      ['analyst', `/api/studies/${studyA}/results.csv`],
    ];
    const bodies: unknown[] = [];
    for (const [user, path] of reads) {
      const response = await getAs(t, user, path);
      expect([path, response.status]).toEqual([path, 200]);
      // When the answer was made is no study data.
      const { generatedAt: _when, ...body } = response.body as Record<string, unknown>;
      bodies.push(response.type === 'text/csv' ? response.text : body);
    }
    return bodies;
  }

  async function runsOf(user: UserKey, siteId = siteA1): Promise<CalibrationRunView[]> {
    const response = await getAs(t, user, `/api/sites/${siteId}/calibration-runs`);
    expect(response.status).toBe(200);
    return response.body as CalibrationRunView[];
  }

  it('passes on a correct installation, with every value, versions and who ran it', async () => {
    const before = await studyViews();
    const started = await postAs(t, 'admin', `/api/sites/${siteA1}/calibration-runs`);
    expect(started.status).toBe(201);
    expect(started.body).toMatchObject({ siteId: siteA1, siteCode: 'NORTH', state: 'queued' });
    await calibrationIdle();

    const [run] = await runsOf('analyst');
    expect(run.id).toBe((started.body as CalibrationRunView).id);
    expect(run.state).toBe('passed');
    expect(run.error).toBeNull();
    expect(run.requestedById).toBe(t.seed.users.admin.id);
    expect(run.requestedByName).toBe('Seeded admin');
    expect(run.finishedAt).not.toBeNull();
    // The code version is backend/package.json's; the settings are the study's version 1.
    const pkg = JSON.parse(readFileSync(join(__dirname, '..', 'package.json'), 'utf8')) as {
      version: string;
    };
    expect(run.gyreVersion).toBe(pkg.version);
    expect(run.settingsVersion).toBe(1);
    expect(run.settings.postWindowS).toEqual([0.2, 0.8]);
    // Known by construction (calibration-signal.ts): 10.0 Hz peak and baseline, Δf −0.5 Hz
    // (the dip holds over the whole default post window), all 29 onsets kept.
    const byKey = Object.fromEntries(run.checks.map((c) => [c.key, c]));
    expect(Object.keys(byKey)).toEqual([
      'restPafHz',
      'taskBaselineHz',
      'taskDeltaFHz',
      'taskTrialsKept',
    ]);
    expect(byKey.restPafHz).toMatchObject({ expected: 10, tolerance: 0.125, passed: true });
    expect(byKey.taskBaselineHz.expected).toBeCloseTo(10, 12);
    expect(byKey.taskDeltaFHz.expected).toBeCloseTo(-0.5, 12);
    expect(byKey.taskTrialsKept).toMatchObject({ expected: 29, computed: 29, tolerance: 0 });
    for (const check of run.checks) {
      expect(check.passed).toBe(true);
      expect(Math.abs((check.computed as number) - check.expected)).toBeLessThanOrEqual(
        check.tolerance,
      );
    }
    // Nothing of it reaches the study's lists, worklists, counts or exports.
    expect(await studyViews()).toEqual(before);
  });

  it('is kept in the audit trail: who started it, and the outcome with its values', async () => {
    const response = await getAs(
      t,
      'monitor',
      '/api/audit?objectType=Calibration&sort=seq&order=asc',
    );
    expect(response.status).toBe(200);
    const entries = (response.body as Page<AuditEntryView>).items;
    expect(entries.map((e) => e.action)).toEqual(['start', 'pass']);
    expect(entries[0]).toMatchObject({ actorId: t.seed.users.admin.id, siteId: siteA1 });
    expect(entries[1].actorId).toBeNull();
    expect(entries[1].after).toMatchObject({ siteCode: 'NORTH', settingsVersion: 1, error: null });
  });

  it('lets a technician run it for their own site only; analysts, monitors and coordinators may not start one', async () => {
    const otherSite = await postAs(
      t,
      'technician',
      `/api/sites/${t.seed.sites.A2.id}/calibration-runs`,
    );
    expect(otherSite.status).toBe(404);
    const otherStudy = await postAs(t, 'technicianB', `/api/sites/${siteA1}/calibration-runs`);
    expect(otherStudy.status).toBe(404);
    for (const user of ['analyst', 'monitor', 'coordinator'] as const) {
      const refused = await postAs(t, user, `/api/sites/${siteA1}/calibration-runs`);
      expect([user, refused.status]).toEqual([user, 403]);
    }
    const coordinatorRead = await getAs(t, 'coordinator', `/api/sites/${siteA1}/calibration-runs`);
    expect(coordinatorRead.status).toBe(403);
    const otherStudyRead = await getAs(t, 'analystB', `/api/sites/${siteA1}/calibration-runs`);
    expect(otherStudyRead.status).toBe(404);
    const own = await postAs(t, 'technician', `/api/sites/${siteA1}/calibration-runs`);
    expect(own.status).toBe(201);
    // A second start while the first waits or computes is refused, naming the site.
    const again = await postAs(t, 'admin', `/api/sites/${siteA1}/calibration-runs`);
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/NORTH already has a calibration run/);
    await calibrationIdle();
    const [run] = await runsOf('technician');
    expect(run).toMatchObject({ state: 'passed', requestedById: t.seed.users.technician.id });
  });

  it('stores a run as failed when the settings are mis-set, and shows it to analysts and monitors', async () => {
    // A deliberately wrong fixed band (14–18 Hz) leaves the 10 Hz alpha outside the filter.
    const changed = await postAs(t, 'analyst', `/api/studies/${studyA}/analysis-settings`, {
      ...DEFAULT_ANALYSIS_SETTINGS,
      bandHz: [14, 18],
      reason: 'Calibration test: a band that misses alpha',
    });
    expect(changed.status).toBe(201);
    const before = await studyViews();
    const started = await postAs(t, 'technician', `/api/sites/${siteA1}/calibration-runs`);
    expect(started.status).toBe(201);
    await calibrationIdle();

    for (const user of ['analyst', 'monitor'] as const) {
      const latest = await getAs(t, user, `/api/calibration-runs/latest?studyId=${studyA}`);
      expect(latest.status).toBe(200);
      const runs = latest.body as CalibrationRunView[];
      expect(runs.map((r) => [r.siteCode, r.state])).toEqual([['NORTH', 'failed']]);
      const [run] = runs;
      expect(run.settingsVersion).toBe(2);
      expect(run.settings.bandHz).toEqual([14, 18]);
      const byKey = Object.fromEntries(run.checks.map((c) => [c.key, c]));
      // The resting PAF does not depend on the band (fixed 7–13 Hz search, docs/method.md §4).
      expect(byKey.restPafHz.passed).toBe(true);
      expect(byKey.taskBaselineHz.passed).toBe(false);
      expect(Math.abs((byKey.taskBaselineHz.computed as number) - 10)).toBeGreaterThan(1);
    }
    const analystB = await getAs(t, 'analystB', '/api/calibration-runs/latest');
    expect(analystB.body).toEqual([]);
    const audit = await getAs(t, 'monitor', '/api/audit?objectType=Calibration&action=fail');
    expect((audit.body as Page<AuditEntryView>).items).toHaveLength(1);
    expect(await studyViews()).toEqual(before);
  });

  it('answers 400 for a malformed site id, and writes nothing', async () => {
    const response = await postAs(t, 'admin', '/api/sites/not-a-uuid/calibration-runs');
    expect(response.status).toBe(400);
    const rows = (await t.dataSource.query(
      'SELECT COUNT(*) AS n FROM "calibration_run"',
    )) as Array<{ n: number }>;
    expect(rows[0].n).toBe(3);
  });
});
