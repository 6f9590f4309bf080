/**
 * A BDF+ recording through the real upload API (a real server on an SQLite file): accepted
 * as BDF+C from its bytes, stored with the identifying header fields blanked exactly as an
 * EDF+ file's, and computed through the normal pipeline. The file is written byte by byte
 * to the format's public description (src/signal/edf/testing/hand-built-bdf.ts: BioSemi's
 * BDF format, van Beelen's BDF+ description), not by Gyre's writer; the signal is generated.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type { RecordingView, RecordingResultsView } from '@gyre/shared';
import { blankPatientField, blankRecordingField } from '../src/signal/edf';
import { seededUniform } from '../src/signal/random/random';
import {
  assembleBdf,
  bdfAnnotationSignal,
  bdfEegSignal,
  bdfPlusParts,
  bdfTalBytes,
  int24le,
} from '../src/signal/edf/testing/hand-built-bdf';
import { acceptedUpload } from './helpers/accepted-upload';
import { useTestApp } from './helpers/test-app';
import {
  INVENTED_PATIENT_FIELD,
  INVENTED_PATIENT_NAME,
  upload,
  waitForState,
} from './recordings-fixtures';
import { tablesHolding } from './helpers/sqlite-rows';

/** Invented identities for the recording field (bytes 88..167). */
const HOSPITAL = 'INVENTED-BDF-HOSP';
const TECHNICIAN = 'Tech_Invented_Bramblewick';

const RATE_HZ = 256;
const DURATION_S = 60;
/** The generated resting alpha peak, Hz: the truth the computed peak is checked against. */
const PEAK_HZ = 9.5;
const CHANNELS = ['EEG O1-REF', 'EEG O2-REF', 'EEG Oz-REF', 'EEG Pz-REF'];

/**
 * A BDF+C resting recording: 4 posterior channels, a 40 µV sine at PEAK_HZ plus seeded noise
 * of ±5 µV, at BioSemi's 31.25 nV per digital step (±262144 µV over 24 bits), in 1 s records
 * each starting with its time-keeping TAL in a 'BDF Annotations' signal.
 */
function restingBdfPlus(): Buffer {
  const random = seededUniform(95);
  const uvPerStep = (262143 - -262144) / (8388607 - -8388608);
  const data: number[] = [];
  for (let r = 0; r < DURATION_S; r++) {
    CHANNELS.forEach((_, c) => {
      const values: number[] = [];
      for (let k = 0; k < RATE_HZ; k++) {
        const t = r + k / RATE_HZ;
        const uv = 40 * Math.sin(2 * Math.PI * PEAK_HZ * t + c) + (random() - 0.5) * 10;
        values.push(Math.round((uv - -262144) / uvPerStep) + -8388608);
      }
      data.push(...int24le(values));
    });
    data.push(...bdfTalBytes(`+${r}\x14\x14\x00`, 30));
  }
  const bytes = assembleBdf({
    fixed: {
      ...bdfPlusParts().fixed,
      patient: INVENTED_PATIENT_FIELD,
      recording: `Startdate 15-JAN-2026 ${HOSPITAL} ${TECHNICIAN} ActiveTwo`,
      startDate: '15.01.26',
      startTime: '09.30.00',
      headerBytes: String(256 * (1 + CHANNELS.length + 1)), // fixed part + EEG + annotations
      recordCount: String(DURATION_S),
      recordDuration: '1',
      signalCount: String(CHANNELS.length + 1),
    },
    signals: [...CHANNELS.map((label) => bdfEegSignal(label, RATE_HZ)), bdfAnnotationSignal(10)],
    data,
  });
  return Buffer.from(bytes);
}

const ORIGINAL = restingBdfPlus();

describe('a BDF+ recording through the upload API', () => {
  const t = useTestApp();
  let accepted: RecordingView;

  beforeAll(async () => {
    accepted = await acceptedUpload(t, { kind: 'resting', bytes: ORIGINAL, fileName: 'rest.bdf' });
  });

  it('is told apart from EDF by its bytes and described as BDF+C', () => {
    expect(accepted.facts).toMatchObject({
      format: 'BDF+C',
      durationS: DURATION_S,
      recordCount: DURATION_S,
      channelLabels: CHANNELS,
      sampleRatesHz: CHANNELS.map(() => RATE_HZ),
      annotationCount: 0,
    });
  });

  it('stores the file with the patient and recording fields blanked as for EDF+, nothing else changed', () => {
    const stored = readFileSync(join(t.config.uploadsDir, `${accepted.checksumSha256}.edf`));
    expect(stored[0]).toBe(0xff);
    expect(stored.subarray(1, 8).toString('latin1')).toBe('BIOSEMI');
    expect(stored.subarray(8, 88).toString('latin1')).toBe('X X X X'.padEnd(80, ' '));
    expect(stored.subarray(88, 168).toString('latin1')).toBe(
      'Startdate 15-JAN-2026 X X X'.padEnd(80, ' '),
    );
    const expected = Buffer.from(ORIGINAL);
    blankPatientField(expected);
    blankRecordingField(expected);
    expect(stored.equals(expected)).toBe(true);
    expect(accepted.checksumSha256).toBe(createHash('sha256').update(expected).digest('hex'));
    for (const secret of [HOSPITAL, TECHNICIAN, INVENTED_PATIENT_NAME]) {
      expect([secret, stored.includes(Buffer.from(secret, 'latin1'))]).toEqual([secret, false]);
    }
  });

  it('keeps no identifying header text in any table', async () => {
    expect(await tablesHolding(t, [HOSPITAL, TECHNICIAN, INVENTED_PATIENT_NAME])).toEqual([]);
  });

  it('computes a resting result whose alpha peak is the generated one', async () => {
    const ready = await waitForState(t, 'technician', accepted.id, ['ready', 'failed']);
    expect(ready.state).toBe('ready');
    const response = await request(t.url)
      .get(`/api/recordings/${accepted.id}/results`)
      .set(await t.authHeader('analyst'));
    expect(response.status).toBe(200);
    const results = response.body as RecordingResultsView;
    // Generated truth: the sine is at 9.5 Hz (the peak within 0.1 Hz, as for EDF recordings).
    expect(Math.abs((results.run.pafHz ?? Number.NaN) - PEAK_HZ)).toBeLessThanOrEqual(0.1);
  });

  it('refuses a malformed BDF with 422 naming the field, and a BDF still being recorded whose size is not whole records', async () => {
    /** A resting upload of `bytes` at site A2, which the server refuses (422). */
    const refusedUpload = async (bytes: Buffer, fileName: string) => {
      const response = await upload(t, 'technicianA2', t.seed.visits.A2.id, {
        kind: 'resting',
        bytes,
        fileName,
      });
      expect(response.status).toBe(422);
      return response;
    };
    const badReserved = Buffer.from(ORIGINAL);
    badReserved.write('BDF+X'.padEnd(44, ' '), 192, 44, 'latin1');
    const refused = await refusedUpload(badReserved, 'bad.bdf');
    expect(JSON.stringify(refused.body)).toContain(
      "reserved: 'BDF+X' in a BDF file (version 0xFF 'BIOSEMI') found",
    );

    const recording = Buffer.concat([ORIGINAL, Buffer.from([1, 2, 3])]);
    recording.write('-1'.padEnd(8, ' '), 236, 8, 'latin1');
    const notWhole = await refusedUpload(recording, 'growing.bdf');
    const recordBytes = 3 * (CHANNELS.length * RATE_HZ + 10);
    expect(JSON.stringify(notWhole.body)).toContain(
      `with ${DURATION_S * recordBytes + 3} bytes after the header found, bytes after the header that are a whole number (at least 1) of data records of ${recordBytes} bytes expected`,
    );
  });
});
