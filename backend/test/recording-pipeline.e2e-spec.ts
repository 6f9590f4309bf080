/**
 * The recording pipeline end to end on a real SQLite file and the real worker pool: upload
 * order does not change a number, a file's kind is checked, a second recording of a kind is
 * an explicit replacement, a file whose physical range hugs its data keeps its channels, and
 * a re-run that reproduces the numbers leaves no new run and no new report revision.
 * Recordings are generated (see recordings-fixtures.ts); the truths named are the generator's.
 */
import request from 'supertest';
import type {
  AnalysisRunView,
  AuditEntryView,
  JobView,
  RecordingView,
  RecordingResultsView,
} from '@gyre/shared';
import { WriteTransactionsService } from '../src/common/database/write-transactions.service';
import { GyreException } from '../src/common/errors/gyre.exception';
import { Recording } from '../src/recordings/recording.entity';
import { RECORDING_TRANSITIONS, RecordingLifecycle } from '../src/recordings/recording-lifecycle';
import { currentSettings } from './helpers/analysis-settings';
import { binaryBody } from './helpers/binary-body';
import { newVisit } from './helpers/new-visit';
import { useTestApp } from './helpers/test-app';
import { syntheticRestEdf, syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';

/** The participant's alpha runs near 8.4 Hz and slows by 0.4 Hz after each onset (generated). */
const BASE_HZ = 8.4;
const DIP_HZ = -0.4;
const taskFile = syntheticTaskEdf({
  durationS: 90,
  baseFrequencyHz: BASE_HZ,
  dipHz: DIP_HZ,
  seed: 41,
});
const restFile = syntheticRestEdf({ durationS: 60, peakHz: BASE_HZ, seed: 43 });

describe('recording pipeline', () => {
  const t = useTestApp();

  async function accepted(visitId: string, kind: 'resting' | 'task', bytes: Uint8Array) {
    const response = await upload(t, 'technician', visitId, { kind, bytes });
    expect(response.status).toBe(201);
    return response.body as RecordingView;
  }

  async function results(recordingId: string): Promise<RecordingResultsView> {
    const response = await request(t.url)
      .get(`/api/recordings/${recordingId}/results`)
      .set(await t.authHeader('analyst'));
    expect(response.status).toBe(200);
    return response.body as RecordingResultsView;
  }

  async function runsOf(recordingId: string): Promise<AnalysisRunView[]> {
    const response = await request(t.url)
      .get(`/api/recordings/${recordingId}/runs`)
      .set(await t.authHeader('analyst'));
    expect(response.status).toBe(200);
    return response.body.items as AnalysisRunView[];
  }

  async function auditOf(objectId: string): Promise<AuditEntryView[]> {
    const response = await request(t.url)
      .get('/api/audit')
      .query({ objectId, pageSize: 100, order: 'asc' })
      .set(await t.authHeader('monitor'));
    expect(response.status).toBe(200);
    return response.body.items as AuditEntryView[];
  }

  describe('upload order', () => {
    let restFirst: { rest: RecordingView; task: RecordingView };
    let taskFirst: { rest: RecordingView; task: RecordingView };

    beforeAll(async () => {
      const v2 = await newVisit(t, 'V2');
      const rest2 = await accepted(v2, 'resting', restFile);
      const task2 = await accepted(v2, 'task', taskFile);
      await t.computationsIdle();
      restFirst = {
        rest: await waitForState(t, 'technician', rest2.id, ['ready']),
        task: await waitForState(t, 'technician', task2.id, ['ready']),
      };

      const v3 = await newVisit(t, 'V3');
      const task3 = await accepted(v3, 'task', taskFile);
      await waitForState(t, 'technician', task3.id, ['ready']);
      const rest3 = await accepted(v3, 'resting', restFile);
      await t.computationsIdle();
      taskFirst = {
        rest: await waitForState(t, 'technician', rest3.id, ['ready']),
        task: await waitForState(t, 'technician', task3.id, ['ready']),
      };
    }, 240_000);

    it('computes a task uploaded before its rest again when the IAF arrives, audited as automatic', async () => {
      const runs = await runsOf(taskFirst.task.id);
      expect(runs).toHaveLength(2);
      // Newest first: the automatic re-run used the IAF, the first run the default band.
      expect(runs[1]).toMatchObject({ bandSource: 'default', bandHz: [8, 13], trigger: 'upload' });
      expect(runs[0]).toMatchObject({ bandSource: 'iaf', trigger: 'rest-changed' });
      const recompute = (await auditOf(taskFirst.task.id)).find((e) => e.action === 'recompute');
      expect(recompute).toBeDefined();
      expect(recompute?.actorId).toBeNull();
      expect(recompute?.reason).toMatch(/resting IAF is now 8\.\d\d Hz/);
    });

    it('ends both upload orders with bit-identical task numbers in the band IAF ± 2 Hz', async () => {
      const a = await results(restFirst.task.id);
      const b = await results(taskFirst.task.id);
      const rest = await results(restFirst.rest.id);
      const iaf = rest.run.pafHz ?? Number.NaN;
      // Generated truth: the resting alpha peak is at 8.4 Hz (PAF within 0.1 Hz).
      expect(Math.abs(iaf - BASE_HZ)).toBeLessThan(0.1);
      for (const r of [a, b]) {
        expect(r.run.bandSource).toBe('iaf');
        expect(r.run.bandHz).toEqual([iaf - 2, iaf + 2]);
      }
      expect(b.run.roiDeltaFHz).toBe(a.run.roiDeltaFHz);
      expect(b.run.roiCiHz).toEqual(a.run.roiCiHz);
      expect(b.run.roiPValue).toBe(a.run.roiPValue);
      expect(b.task?.roi.meanHz).toEqual(a.task?.roi.meanHz);
      // Generated truth: the frequency dips by 0.4 Hz in the post window.
      expect(Math.abs((a.run.roiDeltaFHz ?? 0) - DIP_HZ)).toBeLessThan(0.05);
    });

    it('says on the trajectory when a task band could not follow a resting IAF', async () => {
      const lone = await newVisit(t, 'V3b');
      const task = await accepted(lone, 'task', syntheticTaskEdf({ durationS: 30, seed: 42 }));
      await waitForState(t, 'technician', task.id, ['ready']);
      const response = await request(t.url)
        .get(`/api/participants/${t.seed.participants.A1.id}/trajectory`)
        .set(await t.authHeader('analyst'));
      expect(response.status).toBe(200);
      const visits = response.body.visits as Array<{ label: string; doubts: string[] }>;
      expect(visits.find((v) => v.label === 'V3b')?.doubts).toEqual([
        'Δf in the 8–13 Hz band: the visit has no resting IAF to follow.',
      ]);
      expect(visits.find((v) => v.label === 'V2')?.doubts).toEqual([]);
    });
  });

  describe('kind and replacement', () => {
    let visitId: string;
    let rest: RecordingView;

    beforeAll(async () => {
      visitId = await newVisit(t, 'V4');
      rest = await accepted(visitId, 'resting', restFile);
      await waitForState(t, 'technician', rest.id, ['ready']);
    }, 120_000);

    it('refuses a file with stimulus annotations uploaded as resting, naming what it found', async () => {
      const other = await newVisit(t, 'V5');
      const response = await upload(t, 'technician', other, { kind: 'resting', bytes: taskFile });
      expect(response.status).toBe(422);
      expect(response.body.code).toBe('RECORDING_KIND_UNCONFIRMED');
      // 90 s with an onset every 4 s from 3 s to 87 s: 22 generated onsets.
      expect(response.body.details.onsetCount).toBe(22);
      expect(response.body.message).toContain('22 stimulus onsets');
      expect(response.body.details.recording.state).toBe('rejected');

      const confirmed = await upload(t, 'technician', other, {
        kind: 'resting',
        bytes: taskFile,
        confirmKind: true,
      });
      expect(confirmed.status).toBe(201);
      const dto = confirmed.body as RecordingView;
      expect(dto.kindConfirmed).toBe(true);
      expect(dto.warnings.join(' ')).toMatch(/confirmed the kind/);
    });

    it('refuses a task file without any onset unless the kind is confirmed', async () => {
      const other = await newVisit(t, 'V6');
      const bare = syntheticTaskEdf({ durationS: 30, annotate: false, seed: 44 });
      const response = await upload(t, 'technician', other, { kind: 'task', bytes: bare });
      expect(response.status).toBe(422);
      expect(response.body.code).toBe('RECORDING_KIND_UNCONFIRMED');
      expect(response.body.details.onsetCount).toBe(0);
    });

    it('refuses a second resting recording unless it explicitly replaces the first', async () => {
      const before = await request(t.url)
        .get('/api/recordings')
        .query({ visitId })
        .set(await t.authHeader('technician'));
      const second = syntheticRestEdf({ durationS: 60, peakHz: BASE_HZ, seed: 45 });
      const refused = await upload(t, 'technician', visitId, { kind: 'resting', bytes: second });
      expect(refused.status).toBe(409);
      expect(refused.body.code).toBe('RECORDING_KIND_TAKEN');
      expect(refused.body.details.recordingId).toBe(rest.id);
      const after = await request(t.url)
        .get('/api/recordings')
        .query({ visitId })
        .set(await t.authHeader('technician'));
      expect(after.body.total).toBe(before.body.total);

      const wrong = await upload(t, 'technician', visitId, {
        kind: 'resting',
        bytes: second,
        replaces: {
          recordingId: '00000000-0000-4000-8000-000000000000',
          reason: 'electrode gel dried',
        },
      });
      expect(wrong.status).toBe(409);
      expect(wrong.body.code).toBe('RECORDING_REPLACEMENT_INVALID');

      const replaced = await upload(t, 'technician', visitId, {
        kind: 'resting',
        bytes: second,
        replaces: { recordingId: rest.id, reason: 'electrode gel dried during the first run' },
      });
      expect(replaced.status).toBe(201);
      const next = replaced.body as RecordingView;
      expect(next.replacesId).toBe(rest.id);
      await waitForState(t, 'technician', next.id, ['ready']);

      const earlier = await request(t.url)
        .get(`/api/recordings/${rest.id}`)
        .set(await t.authHeader('technician'));
      expect(earlier.body).toMatchObject({ state: 'superseded', supersededById: next.id });
      // Superseded recordings stay downloadable: the stored copy, byte for byte.
      const file = await request(t.url)
        .get(`/api/recordings/${rest.id}/file`)
        .set(await t.authHeader('analyst'))
        .buffer(true)
        .parse(binaryBody);
      expect(file.status).toBe(200);
      expect((file.body as Buffer).length).toBe(rest.sizeBytes);

      const numbers = await results(next.id);
      expect(numbers.source).toMatchObject({
        recordingId: next.id,
        replacesId: rest.id,
        replacementReason: 'electrode gel dried during the first run',
      });
      const supersede = (await auditOf(rest.id)).find((e) => e.action === 'supersede');
      expect(supersede?.reason).toBe('electrode gel dried during the first run');
    });
  });

  it('keeps every region-of-interest channel of a file whose physical range hugs its data', async () => {
    const visitId = await newVisit(t, 'V7');
    const hugging = syntheticTaskEdf({ durationS: 60, seed: 47, physicalRange: 'hug' });
    const task = await accepted(visitId, 'task', hugging);
    const ready = await waitForState(t, 'technician', task.id, ['ready']);
    // The default posterior set means "those present": names the montage lacks are listed
    // as not in the file, and are no doubt about the number.
    expect(ready.roiUsage?.status).toBe('complete');
    expect(ready.roiUsage?.leftOut.every((o) => o.reason === 'missing')).toBe(true);
    expect(ready.warnings).toEqual([]);
    const r = await results(task.id);
    expect(r.quality.saturatedChannels).toEqual([]);
    expect(r.run.roiUsage.used).toEqual(['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF']);
    // Generated truth: the default dip is −0.6 Hz.
    expect(Math.abs((r.run.roiDeltaFHz ?? 0) + 0.6)).toBeLessThan(0.05);
  });

  it('refuses a settings version with unchanged values and re-runs without a new run or revision', async () => {
    const analyst = await t.authHeader('analyst');
    const studyId = t.seed.studies.A.id;
    const { version, values } = await currentSettings(t, studyId);
    const same = await request(t.url)
      .post(`/api/studies/${studyId}/analysis-settings`)
      .set(analyst)
      .send({ ...values, reason: 'Saving the form again without edits' });
    expect(same.status).toBe(409);
    expect(same.body.code).toBe('ANALYSIS_SETTINGS_UNCHANGED');
    const after = await request(t.url)
      .get(`/api/studies/${studyId}/analysis-settings`)
      .set(analyst);
    expect(after.body.version).toBe(version);

    const visitId = await newVisit(t, 'V8');
    const task = await accepted(visitId, 'task', syntheticTaskEdf({ durationS: 30, seed: 48 }));
    await waitForState(t, 'technician', task.id, ['ready']);
    const state = async () =>
      (await request(t.url).get(`/api/visits/${visitId}/report/sign-off`).set(analyst)).body as {
        draftFingerprint: string | null;
      };
    const before = await state();
    expect(before.draftFingerprint).not.toBeNull();
    const rerun = await request(t.url)
      .post(`/api/recordings/${task.id}/runs`)
      .set(analyst)
      .send({ reason: 'check that nothing moves' });
    expect(rerun.status).toBe(201);
    expect((rerun.body as JobView).trigger).toBe('rerun');
    await waitForState(t, 'analyst', task.id, ['ready']);
    await t.computationsIdle();
    expect(await runsOf(task.id)).toHaveLength(1);
    expect((await state()).draftFingerprint).toBe(before.draftFingerprint);
    const ready = (await auditOf(task.id)).filter((e) => e.action === 'ready');
    expect(ready.at(-1)?.reason).toBe('the computation reproduced the current numbers exactly');
  });

  describe('state machine', () => {
    it('ends only in rejected or superseded, and never leaves them', () => {
      expect(RECORDING_TRANSITIONS.rejected).toEqual([]);
      expect(RECORDING_TRANSITIONS.superseded).toEqual([]);
      expect(RECORDING_TRANSITIONS.ready).not.toContain('validating');
      expect(RECORDING_TRANSITIONS.received).not.toContain('ready');
    });

    it('refuses an illegal move and a move from a state the row no longer has, writing nothing', async () => {
      const visitId = await newVisit(t, 'V9');
      const task = await accepted(visitId, 'task', syntheticTaskEdf({ durationS: 30, seed: 49 }));
      await waitForState(t, 'technician', task.id, ['ready']);
      const lifecycle = t.app.get(RecordingLifecycle);
      const writes = t.app.get(WriteTransactionsService);
      const repository = t.dataSource.getRepository(Recording);
      const auditCount = (await auditOf(task.id)).length;

      const row = await repository.findOneByOrFail({ id: task.id });
      const illegal = writes.run((tx) =>
        lifecycle.transition(tx, row, 'validating', { actor: null, action: 'test' }),
      );
      await expect(illegal).rejects.toMatchObject({ code: 'RECORDING_ILLEGAL_TRANSITION' });

      // A caller holding an old copy (state `computing`) cannot move the ready row.
      const stale = Object.assign(new Recording(), { ...row, state: 'computing' as const });
      const raced = writes.run((tx) =>
        lifecycle.transition(tx, stale, 'failed', { actor: null, action: 'test' }),
      );
      await expect(raced).rejects.toBeInstanceOf(GyreException);
      expect((await repository.findOneByOrFail({ id: task.id })).state).toBe('ready');
      expect(await auditOf(task.id)).toHaveLength(auditCount);
    });
  });
});
