/**
 * Malformed uploads, built byte by byte or by corrupting a generated valid EDF+ file at the
 * offsets of the EDF/EDF+ specification (Kemp et al. 1992; Kemp & Olivan 2003). Each must
 * end `rejected` with the reader's message and leave nothing but the rejected row and its
 * audit entry: no file on disk, no job, no run, no report.
 */
import { createHash } from 'node:crypto';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type { RecordingView } from '@gyre/shared';
import { blankPatientField } from '../src/signal/edf';
import { signalField, SignalFieldName } from '../src/signal/edf/testing/edf-field-layout';
import { countOf } from './helpers/row-count';
import { useTestApp } from './helpers/test-app';
import { syntheticTaskEdf, upload } from './recordings-fixtures';

/** Generated valid file: 10 s, 2 EEG channels + the EDF+ annotation signal, onsets at 3 and 6 s. */
const VALID = syntheticTaskEdf({
  durationS: 10,
  channels: ['EEG O1-REF', 'EEG O2-REF'],
  onsetsS: [3, 6],
});
const SIGNALS = 3;

/** A copy of the valid file with an ASCII field overwritten, space padded. */
function withField(offset: number, width: number, text: string): Uint8Array {
  const bytes = Uint8Array.from(VALID);
  const padded = text.padEnd(width, ' ');
  for (let i = 0; i < width; i++) bytes[offset + i] = padded.charCodeAt(i);
  return bytes;
}

const withSignalField = (field: SignalFieldName, signal: number, text: string): Uint8Array => {
  const { offset, width } = signalField(field, signal, SIGNALS);
  return withField(offset, width, text);
};

/** The first TAL of record 0 starts with '+0' (Kemp & Olivan 2003); break its sign. */
function withBrokenTal(): Uint8Array {
  const bytes = Uint8Array.from(VALID);
  const headerBytes = 256 * (1 + SIGNALS);
  const tal = Buffer.from(bytes).indexOf(Buffer.from('+0\x14\x14', 'latin1'), headerBytes);
  if (tal < 0) throw new Error('no time-keeping TAL found');
  bytes[tal] = 'x'.charCodeAt(0);
  return bytes;
}

interface Case {
  name: string;
  bytes: Uint8Array;
  kind?: 'task' | 'resting';
  onsetsCsv?: string;
  /** Part of the message: the field the reader names. */
  field: RegExp;
}

const CASES: Case[] = [
  { name: 'an empty file', bytes: new Uint8Array(0), field: /file length/ },
  { name: 'a short text file', bytes: Buffer.from('onset_s,label\n1,go\n'), field: /file length/ },
  { name: "version '1'", bytes: withField(0, 8, '1'), field: /version/ },
  {
    name: 'a BDF identification with an EDF reserved field',
    bytes: (() => {
      const b = Uint8Array.from(VALID);
      b.set([0xff, ...Buffer.from('BIOSEMI', 'latin1')], 0);
      return b;
    })(),
    field: /version/,
  },
  {
    name: 'header bytes disagreeing with the signal count',
    bytes: withField(184, 8, '999'),
    field: /header bytes/,
  },
  { name: 'zero signals', bytes: withField(252, 4, '0'), field: /number of signals/ },
  {
    name: 'a non-numeric signal count',
    bytes: withField(252, 4, 'ab'),
    field: /number of signals/,
  },
  {
    // EDF+ (Kemp & Olivan 2003) allows −1 while recording; the count then comes from the file
    // size, which here is not a whole number of records.
    name: 'a record count of −1 on a file cut mid-record',
    bytes: (() => {
      const b = withField(236, 8, '-1');
      return b.subarray(0, b.byteLength - 100);
    })(),
    field: /number of data records/,
  },
  {
    name: 'more records than the file holds',
    bytes: withField(236, 8, '11'),
    field: /file length|data records/,
  },
  {
    name: 'a truncated data section',
    bytes: VALID.subarray(0, VALID.byteLength - 100),
    field: /file length|data records/,
  },
  {
    name: 'a record duration of 0',
    bytes: withField(244, 8, '0'),
    field: /duration of a data record/,
  },
  {
    name: 'digital minimum ≥ digital maximum',
    bytes: withSignalField('digitalMin', 0, '40000'),
    field: /digital/,
  },
  {
    name: 'physical minimum = physical maximum',
    bytes: withSignalField('physicalMax', 1, '-500'),
    field: /physical/,
  },
  {
    name: 'non-numeric samples per record',
    bytes: withSignalField('samplesPerRecord', 0, 'many'),
    field: /samples/,
  },
  {
    name: 'a non-ASCII byte in a signal label',
    bytes: (() => {
      const b = Uint8Array.from(VALID);
      b[signalField('label', 0, SIGNALS).offset + 3] = 0xe9;
      return b;
    })(),
    field: /label|ASCII|printable/i,
  },
  { name: 'a broken EDF+ annotation (TAL)', bytes: withBrokenTal(), field: /annotation|TAL/i },
  // A task file without onsets is a well-formed file of a doubtful kind: see
  // recording-pipeline.e2e-spec.ts (422 RECORDING_KIND_UNCONFIRMED unless confirmed).
  {
    name: 'an onset CSV with an onset after the recording ends',
    bytes: syntheticTaskEdf({ durationS: 10, channels: ['EEG O1-REF'], annotate: false, seed: 2 }),
    onsetsCsv: 'onset_s,label\n3,stimulus\n42,stimulus\n',
    field: /onset CSV, line 3/,
  },
  {
    name: 'an onset CSV with the wrong header',
    bytes: syntheticTaskEdf({ durationS: 10, channels: ['EEG O1-REF'], annotate: false, seed: 3 }),
    onsetsCsv: 'time,label\n3,stimulus\n',
    field: /onset CSV, line 1/,
  },
];

describe('malformed uploads', () => {
  const t = useTestApp();
  beforeAll(async () => {
    await t.authHeader('technician'); // the sign-in writes its own audit entry; do it first
  });

  const count = (table: string): Promise<number> => countOf(t, table);

  it.each(CASES.map((c) => [c.name, c] as const))(
    'rejects %s with the reader’s message',
    async (_name, c) => {
      const auditBefore = await count('audit_entry');
      const recordingsBefore = await count('recording');
      const response = await upload(t, 'technician', t.seed.visits.A1.id, {
        kind: c.kind ?? 'task',
        bytes: c.bytes,
        onsetsCsv: c.onsetsCsv,
      });
      expect(response.status).toBe(422);
      expect(response.body.code).toBe('RECORDING_REJECTED');
      expect(response.body.message).toMatch(c.field);
      // The message says what was found and what was expected.
      expect(response.body.message).toMatch(/found, .* expected/);
      const recording = response.body.details.recording as RecordingView;
      expect(recording.state).toBe('rejected');
      expect(recording.rejection?.message).toBe(response.body.message);
      // The checksum is of the bytes as they would have been stored (patient field blanked).
      const blanked = Buffer.from(c.bytes);
      if (blanked.byteLength >= 256) blankPatientField(blanked);
      else if (blanked.byteLength > 8) blanked.fill(0x20, 8, Math.min(88, blanked.byteLength));
      expect(recording.checksumSha256).toBe(createHash('sha256').update(blanked).digest('hex'));

      const stored = await request(t.url)
        .get(`/api/recordings/${recording.id}`)
        .set(await t.authHeader('technician'));
      expect(stored.body).toMatchObject({
        state: 'rejected',
        facts: null,
        latestJob: null,
        latestRunId: null,
      });

      // Nothing else: one new row whose trail is its three moves, no file, no job, no run, no report.
      expect(await count('recording')).toBe(recordingsBefore + 1);
      const entries = (await t.dataSource.query(
        `SELECT "action", "objectType", "objectId", "reason", "after" FROM "audit_entry" WHERE "seq" > ? ORDER BY "seq"`,
        [auditBefore],
      )) as Array<{
        action: string;
        objectType: string;
        objectId: string;
        reason: string | null;
        after: string;
      }>;
      expect(entries.map((e) => [e.action, e.objectType, e.objectId])).toEqual([
        ['upload', 'Recording', recording.id],
        ['validate', 'Recording', recording.id],
        ['reject', 'Recording', recording.id],
      ]);
      expect(entries[2].reason).toBe(response.body.message);
      expect(JSON.parse(entries[2].after)).toMatchObject({ state: 'rejected' });
      for (const table of ['job', 'analysis_run', 'report', 'flag'])
        expect(await count(table)).toBe(0);
      expect(readdirSync(t.config.uploadsDir).filter((f) => f !== 'tmp')).toEqual([]);
      expect(readdirSync(join(t.config.uploadsDir, 'tmp'))).toEqual([]);
    },
  );

  it('lets the technician upload the corrected file afterwards (a rejection does not block it)', async () => {
    const fixed = await upload(t, 'technician', t.seed.visits.A1.id, {
      kind: 'task',
      bytes: VALID,
    });
    expect(fixed.status).toBe(201);
    expect(CASES.length).toBeGreaterThanOrEqual(10);
  });
});
