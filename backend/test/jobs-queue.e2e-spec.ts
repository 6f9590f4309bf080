/**
 * The job queue in the running app: a failing computation uses its three attempts and
 * ends `failed` without touching another recording's job; a retry after the cause is
 * fixed succeeds; re-runs are audited and record the settings version they used.
 * Recordings are generated (see recordings-fixtures.ts).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type { AnalysisRunView, JobView, RecordingView } from '@gyre/shared';
import { currentSettings } from './helpers/analysis-settings';
import { acceptedUpload } from './helpers/accepted-upload';
import { useTestApp } from './helpers/test-app';
import { syntheticRestEdf, syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';

describe('job queue', () => {
  const t = useTestApp();
  let broken: RecordingView;
  let healthy: RecordingView;

  beforeAll(async () => {
    const a = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 30, seed: 31 }),
    });
    const b = await upload(t, 'technicianA2', t.seed.visits.A2.id, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 30, seed: 32 }),
    });
    expect([a.status, b.status]).toEqual([201, 201]);
    broken = await waitForState(t, 'technician', (a.body as RecordingView).id, ['ready']);
    healthy = await waitForState(t, 'technicianA2', (b.body as RecordingView).id, ['ready']);
  });

  it('fails one recording after 3 attempts while another computes to ready', async () => {
    const file = join(t.config.uploadsDir, `${broken.checksumSha256}.edf`);
    const good = readFileSync(file);
    // Damage the stored copy: the worker checks the SHA-256 the run is meant to read.
    writeFileSync(
      file,
      Buffer.concat([good.subarray(0, 1000), Buffer.alloc(16, 0x41), good.subarray(1016)]),
    );
    const analyst = await t.authHeader('analyst');
    const reruns = await Promise.all([
      request(t.url)
        .post(`/api/recordings/${broken.id}/runs`)
        .set(analyst)
        .send({ reason: 'check the queue' }),
      request(t.url).post(`/api/recordings/${healthy.id}/runs`).set(analyst).send({}),
    ]);
    expect(reruns.map((r) => r.status)).toEqual([201, 201]);
    const failed = await waitForState(t, 'technician', broken.id, ['failed']);
    expect(failed.latestJob).toMatchObject({ state: 'failed', attempts: 3, maxAttempts: 3 });
    expect(failed.failureMessage).toMatch(
      /^Attempt 3 of 3 failed: stored file: SHA-256 [0-9a-f]{64} found, [0-9a-f]{64} expected/,
    );
    const ok = await waitForState(t, 'technicianA2', healthy.id, ['ready', 'failed']);
    expect(ok.state).toBe('ready');
    expect(ok.latestJob).toMatchObject({ state: 'done', attempts: 1 });
    // The failed recording keeps its earlier result; nothing new was stored for it.
    const runs = await request(t.url).get(`/api/recordings/${broken.id}/runs`).set(analyst);
    expect(runs.body.total).toBe(1);

    writeFileSync(file, good);
    const retry = await request(t.url)
      .post(`/api/recordings/${broken.id}/retry`)
      .set(await t.authHeader('technician'));
    expect(retry.status).toBe(201);
    const again = await waitForState(t, 'technician', broken.id, ['ready', 'failed']);
    expect(again.state).toBe('ready');
    expect(again.latestJob).toMatchObject({ state: 'done', attempts: 1 });
  });

  it('refuses a retry of a recording that has not failed (409)', async () => {
    const response = await request(t.url)
      .post(`/api/recordings/${healthy.id}/retry`)
      .set(await t.authHeader('technicianA2'));
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('RECORDING_NOT_RETRYABLE');
  });

  it('audits re-runs and retries with before/after and reason', async () => {
    const rows = (await t.dataSource.query(
      `SELECT "action", "objectId", "before", "after", "reason" FROM "audit_entry" WHERE "action" IN ('rerun', 'retry') ORDER BY "seq"`,
    )) as Array<{
      action: string;
      objectId: string;
      before: string;
      after: string;
      reason: string | null;
    }>;
    // The two re-runs were requested at once: their order is free; the retry came last.
    expect(rows.map((r) => `${r.action} ${r.objectId}`).sort()).toEqual(
      [`rerun ${broken.id}`, `rerun ${healthy.id}`, `retry ${broken.id}`].sort(),
    );
    expect(rows[rows.length - 1]).toMatchObject({ action: 'retry', objectId: broken.id });
    const first = rows.find((r) => r.action === 'rerun' && r.objectId === broken.id);
    expect(first?.reason).toBe('check the queue');
    expect(JSON.parse(first?.before ?? 'null')).toEqual({ state: 'ready' });
    expect(JSON.parse(first?.after ?? 'null')).toMatchObject({
      state: 'queued',
      trigger: 'rerun',
      automatic: false,
    });
  });

  it('re-runs a whole visit with a new settings version, recorded in each run; task band follows the resting IAF', async () => {
    const rest = await acceptedUpload(t, {
      kind: 'resting',
      bytes: syntheticRestEdf({ durationS: 60, peakHz: 9.5 }),
    });
    await waitForState(t, 'technician', rest.id, ['ready']);
    // The task follows the new resting IAF by itself; wait for that before re-running.
    await t.computationsIdle();
    const analyst = await t.authHeader('analyst');
    const { values } = await currentSettings(t, t.seed.studies.A.id);
    const changed = await request(t.url)
      .post(`/api/studies/${t.seed.studies.A.id}/analysis-settings`)
      .set(analyst)
      .send({
        ...values,
        rejectionThresholdUv: 150,
        reason: 'Looser amplitude rejection for this cohort',
      });
    expect(changed.status).toBe(201);
    expect(changed.body.version).toBe(2);

    const rerun = await request(t.url)
      .post(`/api/visits/${t.seed.visits.A1.id}/runs`)
      .set(analyst)
      .send({ reason: 'settings v2' });
    expect(rerun.status).toBe(201);
    const jobs = rerun.body as JobView[];
    expect(jobs.map((j) => j.trigger)).toEqual(['rerun', 'rerun']);
    for (const job of jobs) await waitForState(t, 'analyst', job.recordingId, ['ready']);

    const taskRuns = await request(t.url).get(`/api/recordings/${broken.id}/runs`).set(analyst);
    const latestTask = (taskRuns.body.items as AnalysisRunView[])[0];
    const restRuns = await request(t.url).get(`/api/recordings/${rest.id}/runs`).set(analyst);
    const latestRest = (restRuns.body.items as AnalysisRunView[])[0];
    expect(latestRest.settingsVersion).toBe(2);
    // Generated truth: the resting alpha peak is at 9.5 Hz.
    expect(latestRest.pafHz).toBeCloseTo(9.5, 0);
    expect(latestTask.settingsVersion).toBe(2);
    // docs/method.md §2: without a band in the settings, the task band is the visit's IAF ± 2 Hz.
    const iaf = latestRest.pafHz ?? latestRest.cogHz ?? Number.NaN;
    expect(latestTask.bandSource).toBe('iaf');
    expect(latestTask.bandHz[0]).toBeCloseTo(iaf - 2, 12);
    expect(latestTask.bandHz[1]).toBeCloseTo(iaf + 2, 12);
  });
});
