/**
 * The uploaded file's name: kept as the technician's computer sent it (last path segment),
 * shown only to callers in the recording's row scope, never with the EDF patient field.
 * Every recording is generated (recordings-fixtures.ts).
 */
import request from 'supertest';
import type { Page, RecordingView } from '@gyre/shared';
import { acceptedUpload } from './helpers/accepted-upload';
import { sqlRows } from './helpers/sqlite-rows';
import { useTestApp } from './helpers/test-app';
import { INVENTED_PATIENT_NAME, syntheticRestEdf, upload } from './recordings-fixtures';

describe('recording file names', () => {
  const t = useTestApp();
  let accepted: RecordingView;
  let rejected: RecordingView;

  beforeAll(async () => {
    accepted = await acceptedUpload(t, {
      kind: 'resting',
      bytes: syntheticRestEdf({ durationS: 20, seed: 71 }),
      // A browser on Windows may send the whole path; only the last segment is the name.
      fileName: 'C:\\exports\\A1-0001 V1 rest.edf',
    });
    const whole = syntheticRestEdf({ durationS: 20, seed: 72 });
    // EDF spec (Kemp et al. 1992): header bytes + records × record size = file size; cut short.
    // As a task: the visit's resting slot is taken; the reader refuses the file before any kind check.
    const bad = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'task',
      bytes: whole.subarray(0, whole.byteLength - 1000),
      fileName: 'rest-cut.edf',
    });
    expect(bad.status).toBe(422);
    rejected = (bad.body as { details: { recording: RecordingView } }).details.recording;
  });

  it('keeps the last segment of the uploaded name on accepted and rejected recordings', async () => {
    expect(accepted.fileName).toBe('A1-0001 V1 rest.edf');
    expect(rejected.fileName).toBe('rest-cut.edf');
    expect(rejected.state).toBe('rejected');
    const listed = await request(t.url)
      .get('/api/recordings')
      .query({ visitId: t.seed.visits.A1.id })
      .set(await t.authHeader('technician'));
    expect(listed.status).toBe(200);
    const names = (listed.body as Page<RecordingView>).items.map((r) => r.fileName).sort();
    expect(names).toEqual(['A1-0001 V1 rest.edf', 'rest-cut.edf']);
    // The EDF header's patient field is blanked on the way in and never shown.
    expect(JSON.stringify(listed.body)).not.toContain(INVENTED_PATIENT_NAME);
  });

  it('shows the name only to callers in the recording scope', async () => {
    for (const outsider of ['technicianA2', 'technicianB', 'analystB'] as const) {
      const one = await request(t.url)
        .get(`/api/recordings/${accepted.id}`)
        .set(await t.authHeader(outsider));
      expect(one.status).toBe(404);
      const list = await request(t.url)
        .get('/api/recordings')
        .query({ visitId: t.seed.visits.A1.id })
        .set(await t.authHeader(outsider));
      expect(list.status).toBe(200);
      expect((list.body as Page<RecordingView>).items).toEqual([]);
    }
    const analyst = await request(t.url)
      .get(`/api/recordings/${accepted.id}`)
      .set(await t.authHeader('analyst'));
    expect(analyst.body.fileName).toBe('A1-0001 V1 rest.edf');
  });

  it('keeps the file name out of the audit trail', async () => {
    const rows = sqlRows<Record<string, unknown>>(t, 'SELECT * FROM audit_entry');
    expect(rows.length).toBeGreaterThan(0);
    expect(JSON.stringify(rows)).not.toContain('rest-cut.edf');
    expect(JSON.stringify(rows)).not.toContain('A1-0001 V1 rest.edf');
  });
});
