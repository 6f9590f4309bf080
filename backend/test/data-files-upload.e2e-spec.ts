/**
 * What an upload leaves on disk: the size limit is the largest size accepted, and the stored
 * copy carries no identifying EDF+ recording field (Kemp & Olivan 2003: `Startdate dd-MMM-yyyy
 * hospital-code technician-code equipment-code`), with the checksum of those blanked bytes.
 */
import { createHash } from 'node:crypto';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { RecordingView } from '@gyre/shared';
import { blankPatientField, blankRecordingField } from '../src/signal/edf';
import { acceptedUpload } from './helpers/accepted-upload';
import { countOf } from './helpers/row-count';
import { useTestApp } from './helpers/test-app';
import { INVENTED_PATIENT_NAME, syntheticTaskEdf, upload } from './recordings-fixtures';
import { tablesHolding } from './helpers/sqlite-rows';

const sha256 = (bytes: Uint8Array): string => createHash('sha256').update(bytes).digest('hex');

/** Invented identities written into the recording field (bytes 88..167). */
const HOSPITAL = 'INVENTED-HOSP-42';
const TECHNICIAN = 'Tech_Invented_Quillfeather';
const EQUIPMENT = 'AMP-INVENTED-7';

/** A generated EDF+ task file whose recording field names a hospital, technician and amplifier. */
function withRecordingField(field: string): Buffer {
  const bytes = Buffer.from(
    syntheticTaskEdf({ durationS: 10, channels: ['EEG O1-REF', 'EEG O2-REF'], onsetsS: [3, 6] }),
  );
  bytes.write(field.padEnd(80, ' '), 88, 80, 'latin1');
  return bytes;
}

const ORIGINAL = withRecordingField(`Startdate 15-JAN-2026 ${HOSPITAL} ${TECHNICIAN} ${EQUIPMENT}`);

describe('UPLOAD_MAX_BYTES is the largest size accepted (common practice: a limit is inclusive)', () => {
  // The limit is set to exactly the size of the file.
  const t = useTestApp({ env: { UPLOAD_MAX_BYTES: String(ORIGINAL.byteLength) } });

  it('accepts a recording of exactly UPLOAD_MAX_BYTES', async () => {
    expect(t.config.uploadMaxBytes).toBe(ORIGINAL.byteLength);
    const response = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'task',
      bytes: ORIGINAL,
    });
    expect(response.status).toBe(201);
    expect((response.body as RecordingView).sizeBytes).toBe(ORIGINAL.byteLength);
  });

  it('an onset CSV larger than UPLOAD_MAX_BYTES (but within its own 4 MiB) arrives whole, not cut at that limit', async () => {
    // Blank lines are skipped by the CSV reader: the second onset sits past UPLOAD_MAX_BYTES.
    const csv = `onset_s,label\n3,stimulus\n${'\n'.repeat(ORIGINAL.byteLength)}6,stimulus\n`;
    expect(csv.length).toBeGreaterThan(t.config.uploadMaxBytes);
    const response = await upload(t, 'technicianA2', t.seed.visits.A2.id, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 10, channels: ['EEG O1-REF'], annotate: false }),
      onsetsCsv: csv,
    });
    expect(response.status).toBe(201);
    expect((response.body as RecordingView).facts?.csvOnsetCount).toBe(2);
  });

  it('refuses one byte more with 413 naming the limit, and keeps nothing', async () => {
    const recordingsBefore = await countOf(t, 'recording');
    const auditBefore = await countOf(t, 'audit_entry');
    const response = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'resting',
      bytes: Buffer.concat([ORIGINAL, Buffer.from([0x20])]),
    });
    expect(response.status).toBe(413);
    expect(response.body).toEqual({
      statusCode: 413,
      code: 'RECORDING_TOO_LARGE',
      message: `file: more than ${ORIGINAL.byteLength} bytes sent, at most ${ORIGINAL.byteLength} bytes accepted`,
      details: { field: 'file', limitBytes: ORIGINAL.byteLength },
    });
    expect(await countOf(t, 'recording')).toBe(recordingsBefore);
    expect(await countOf(t, 'audit_entry')).toBe(auditBefore);
    const tmp = join(t.config.uploadsDir, 'tmp');
    expect(existsSync(tmp) ? readdirSync(tmp) : []).toEqual([]);
  });
});

describe('the stored copy carries no identifying recording field (EDF+, Kemp & Olivan 2003)', () => {
  const t = useTestApp();
  let accepted: RecordingView;

  beforeAll(async () => {
    accepted = await acceptedUpload(t, { kind: 'task', bytes: ORIGINAL });
  });

  it('stores the recording field as Startdate <date> X X X, the patient field as X X X X', () => {
    const stored = readFileSync(join(t.config.uploadsDir, `${accepted.checksumSha256}.edf`));
    expect(stored.subarray(88, 168).toString('latin1')).toBe(
      'Startdate 15-JAN-2026 X X X'.padEnd(80, ' '),
    );
    expect(stored.subarray(8, 15).toString('latin1')).toBe('X X X X');
    for (const secret of [HOSPITAL, TECHNICIAN, EQUIPMENT, INVENTED_PATIENT_NAME]) {
      expect([secret, stored.includes(Buffer.from(secret, 'latin1'))]).toEqual([secret, false]);
    }
    // Only the two identifying fields changed: every other byte is the upload's.
    const expected = Buffer.from(ORIGINAL);
    blankPatientField(expected);
    blankRecordingField(expected);
    expect(stored.equals(expected)).toBe(true);
  });

  it('the checksum is that of the blanked bytes, not of the upload', () => {
    const blanked = Buffer.from(ORIGINAL);
    blankPatientField(blanked);
    blankRecordingField(blanked);
    const patientOnly = Buffer.from(ORIGINAL);
    blankPatientField(patientOnly);
    expect(accepted.checksumSha256).toBe(sha256(blanked));
    expect(accepted.checksumSha256).not.toBe(sha256(patientOnly));
    expect(accepted.checksumSha256).not.toBe(sha256(ORIGINAL));
  });

  it('nothing in the database keeps the recording field', async () => {
    expect(await tablesHolding(t, [HOSPITAL, TECHNICIAN, EQUIPMENT])).toEqual([]);
  });

  it('the same recording with another hospital and technician in its header is the same file once blanked (409)', async () => {
    const other = withRecordingField('Startdate 15-JAN-2026 OTHER-HOSP-9 Tech_Other EEG-2');
    const response = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'task',
      bytes: other,
    });
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('RECORDING_DUPLICATE');
    expect(response.body.details.recordingId).toBe(accepted.id);
  });
});
