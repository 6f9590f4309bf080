/**
 * Uploads through the real API on a temporary DATA_DIR (real SQLite file, real worker
 * threads). Every recording is generated (see recordings-fixtures.ts).
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type { RecordingView, RecordingResultsView } from '@gyre/shared';
import { DEFAULT_ANALYSIS_SETTINGS } from '../src/signal/pipeline/analysis-settings';
import { blankPatientField, readEdf } from '../src/signal/edf';
import { analyzeRecording } from '../src/signal/pipeline/analyze-recording';
import { acceptedUpload } from './helpers/accepted-upload';
import { useTestApp } from './helpers/test-app';
import {
  INVENTED_PATIENT_NAME,
  syntheticRestEdf,
  syntheticTaskEdf,
  taskOnsets,
  upload,
  waitForState,
} from './recordings-fixtures';
import { textBody } from './helpers/binary-body';

const sha256 = (bytes: Uint8Array): string => createHash('sha256').update(bytes).digest('hex');

describe('recording uploads', () => {
  const t = useTestApp();
  const original = syntheticTaskEdf({ durationS: 60, seed: 11 });
  let accepted: RecordingView;

  beforeAll(async () => {
    accepted = await acceptedUpload(t, { kind: 'task', bytes: original });
  });

  it('accepts a generated EDF+ task recording, queues it and computes it to ready', async () => {
    expect(accepted.state).toBe('queued');
    expect(accepted.kind).toBe('task');
    expect(accepted.facts?.durationS).toBe(60);
    expect(accepted.facts?.annotationCount).toBe(taskOnsets(60).length);
    const ready = await waitForState(t, 'technician', accepted.id, ['ready', 'failed']);
    expect(ready.state).toBe('ready');
    expect(ready.latestJob).toMatchObject({
      state: 'done',
      attempts: 1,
      progressPercent: 100,
      trigger: 'upload',
    });
  });

  it('stores the file under uploads/<checksum>.edf with the patient field blanked by the signal core', () => {
    const expected = Buffer.from(original);
    blankPatientField(expected);
    const stored = readFileSync(join(t.config.uploadsDir, `${accepted.checksumSha256}.edf`));
    // The stored copy is the upload with only header bytes 8..87 changed (Kemp & Olivan 2003: 'X X X X').
    expect(stored.equals(expected)).toBe(true);
    expect(sha256(stored)).toBe(accepted.checksumSha256);
    expect(stored.includes(Buffer.from(INVENTED_PATIENT_NAME))).toBe(false);
    expect(readdirSync(t.config.uploadsDir).filter((f) => f !== 'tmp')).toEqual([
      `${accepted.checksumSha256}.edf`,
    ]);
  });

  it('reports the same Δf as the signal core run directly on the same file, near the generated −0.6 Hz dip', async () => {
    await waitForState(t, 'technician', accepted.id, ['ready']);
    const response = await request(t.url)
      .get(`/api/recordings/${accepted.id}/results`)
      .set(await t.authHeader('analyst'));
    expect(response.status).toBe(200);
    const results = response.body as RecordingResultsView;
    // The same settings and no IAF (the visit has no resting recording): the same numbers.
    const direct = analyzeRecording(readEdf(original), DEFAULT_ANALYSIS_SETTINGS, {
      kind: 'task',
      iafHz: null,
    });
    expect(direct.roi).not.toBeNull();
    expect(results.run.roiDeltaFHz).toBe(direct.roi?.deltaFHz);
    expect(results.run.roiCiHz).toEqual(direct.roi?.ciHz);
    expect(results.run.trialsKept).toBe(direct.roi?.trialsKept);
    // Generated truth: the synthetic frequency dips by 0.6 Hz from +0.2 to +0.8 s.
    expect(results.run.roiDeltaFHz).toBeGreaterThan(-0.65);
    expect(results.run.roiDeltaFHz).toBeLessThan(-0.55);
    expect(results.run).toMatchObject({
      settingsVersion: 1,
      codeVersion: expect.stringMatching(/^\d+\.\d+\.\d+/),
      inputChecksumSha256: accepted.checksumSha256,
      bandHz: [8, 13],
      bandSource: 'default',
      suggestsSlowing: true,
    });
    const task = results.task;
    expect(task).not.toBeNull();
    expect(task?.roi.meanHz.length).toBe(task?.timeS.length);
    // The raster itself comes from GET …/results/raster (results-shape.e2e-spec.ts).
    expect(task?.raster.trials).toBe(direct.roi?.rasterTrials);
    expect(task?.raster.points).toBeLessThanOrEqual(500);
    expect(task?.curveChannels).toEqual(direct.channels.map((c) => c.label));
    expect(results.channels.find((c) => c.label === 'EEG O1-REF')?.inRoi).toBe(true);
    expect(results.quality.durationS).toBe(60);
    expect(results.quality.roiChannelsFound.length).toBe(3);
  });

  it('refuses the same file again in the same visit with 409 and keeps nothing of it', async () => {
    const before = await t.dataSource.query(`SELECT count(*) AS n FROM "recording"`);
    const response = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'task',
      bytes: original,
    });
    expect(response.status).toBe(409);
    expect(response.body).toMatchObject({
      code: 'RECORDING_DUPLICATE',
      details: { recordingId: accepted.id },
    });
    expect(await t.dataSource.query(`SELECT count(*) AS n FROM "recording"`)).toEqual(before);
    expect(readdirSync(join(t.config.uploadsDir, 'tmp'))).toEqual([]);
  });

  it('takes an onset CSV beside a task recording and counts its onsets', async () => {
    const bytes = syntheticTaskEdf({ durationS: 40, seed: 12, annotate: false });
    const csv = ['onset_s,label', ...taskOnsets(40).map((s) => `${s},stimulus`)].join('\n');
    // Another visit: the seeded one already has its task recording.
    const visit = await request(t.url)
      .post('/api/visits')
      .set(await t.authHeader('technician'))
      .send({ participantId: t.seed.participants.A1.id, label: 'V2', visitDate: '2026-02-01' });
    expect(visit.status).toBe(201);
    const dto = await acceptedUpload(t, { kind: 'task', bytes, onsetsCsv: csv }, visit.body.id);
    expect(dto.facts?.csvOnsetCount).toBe(taskOnsets(40).length);
    const ready = await waitForState(t, 'technician', dto.id, ['ready', 'failed']);
    expect(ready.state).toBe('ready');
    const results = await request(t.url)
      .get(`/api/recordings/${dto.id}/results`)
      .set(await t.authHeader('analyst'));
    expect((results.body as RecordingResultsView).run.trialsTotal).toBe(taskOnsets(40).length);
  });

  it('refuses an onset CSV beside a resting recording (400) and an unknown kind (400)', async () => {
    const rest = syntheticRestEdf({ durationS: 20 });
    const withCsv = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'resting',
      bytes: rest,
      onsetsCsv: 'onset_s,label\n3,stimulus\n',
    });
    expect(withCsv.status).toBe(400);
    expect(withCsv.body).toMatchObject({
      code: 'RECORDING_FORM_INVALID',
      details: { field: 'onsets' },
    });
    const badKind = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'sleep',
      bytes: rest,
    });
    expect(badKind.status).toBe(400);
    expect(badKind.body.message).toBe("kind: 'sleep' found, one of resting, task expected");
  });

  it('streams the state as Server-Sent Events until a final state', async () => {
    const bytes = syntheticRestEdf({ durationS: 30, seed: 5 });
    const { id } = await acceptedUpload(t, { kind: 'resting', bytes });
    const events = await request(t.url)
      .get(`/api/recordings/${id}/events`)
      .set(await t.authHeader('technician'))
      .buffer(true)
      .parse(textBody);
    expect(events.status).toBe(200);
    expect(events.headers['content-type']).toMatch(/text\/event-stream/);
    const states = String(events.body)
      .split('\n')
      .filter((line) => line.startsWith('data: '))
      .map((line) => (JSON.parse(line.slice(6)) as { state: string }).state);
    expect(states[states.length - 1]).toBe('ready');
    expect(String(events.body)).toContain('event: recording');
  });

  it('lists recordings with server-side filter, sort and pages', async () => {
    const all = await request(t.url)
      .get('/api/recordings')
      .query({ visitId: t.seed.visits.A1.id, sort: 'createdAt', order: 'asc', pageSize: 2 })
      .set(await t.authHeader('analyst'));
    expect(all.status).toBe(200);
    // The task and the resting recording of the visit (refused uploads leave no row).
    expect(all.body.total).toBe(2);
    expect(all.body.items).toHaveLength(2);
    expect(all.body.items[0].id).toBe(accepted.id);
    const resting = await request(t.url)
      .get('/api/recordings')
      .query({ kind: 'resting' })
      .set(await t.authHeader('analyst'));
    expect(resting.body.items.every((r: RecordingView) => r.kind === 'resting')).toBe(true);
    expect(resting.body.total).toBe(1);
  });

  it('never writes the patient field into the database file', async () => {
    await t.dataSource.query('PRAGMA wal_checkpoint(TRUNCATE)');
    for (const file of readdirSync(t.dataDir).filter((f) => f.startsWith('gyre.sqlite'))) {
      expect(readFileSync(join(t.dataDir, file)).includes(Buffer.from(INVENTED_PATIENT_NAME))).toBe(
        false,
      );
    }
  });
});

describe('upload size limit', () => {
  const t = useTestApp({ env: { UPLOAD_MAX_BYTES: '65536' } });

  it('answers 413 beyond UPLOAD_MAX_BYTES and keeps no row and no file', async () => {
    const bytes = syntheticTaskEdf({ durationS: 60 }); // about 125 kB
    expect(bytes.byteLength).toBeGreaterThan(65536);
    const response = await upload(t, 'technician', t.seed.visits.A1.id, { kind: 'task', bytes });
    expect(response.status).toBe(413);
    expect(response.body).toMatchObject({
      code: 'RECORDING_TOO_LARGE',
      details: { limitBytes: 65536 },
    });
    expect(await t.dataSource.query(`SELECT count(*) AS n FROM "recording"`)).toEqual([{ n: 0 }]);
    expect(readdirSync(join(t.config.uploadsDir, 'tmp'))).toEqual([]);
  });

  it('still accepts a file under the limit', async () => {
    const bytes = syntheticTaskEdf({ durationS: 20 });
    expect(bytes.byteLength).toBeLessThan(65536);
    await acceptedUpload(t, { kind: 'task', bytes });
  });
});
