import { Readable } from 'node:stream';
import { blankPatientField, blankRecordingField, writeEdf } from '../../signal/edf';
import { IdentifyingFieldsBlanker } from './identifying-fields-blanker';

async function runThrough(bytes: Uint8Array, chunkBytes: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for (let i = 0; i < bytes.byteLength; i += chunkBytes) {
    chunks.push(Buffer.from(bytes.subarray(i, i + chunkBytes)));
  }
  const out: Buffer[] = [];
  for await (const chunk of Readable.from(chunks).pipe(new IdentifyingFieldsBlanker())) {
    out.push(chunk as Buffer);
  }
  return Buffer.concat(out);
}

/** Generated EDF+ file: 2 s of a ramp on one channel, with made-up patient and recording fields. */
function generatedEdf(): Uint8Array {
  const samples = new Float32Array(512).map((_, i) => (i % 200) - 100);
  return writeEdf({
    startDate: '2024-03-01T10:00:00',
    patientId: 'MCH-0001 F 02-MAY-1951 Invented_Name',
    recordingId: 'Startdate 01-MAR-2024 INVENTED-HOSP-77 Tech_Invented_Person Amp-Model-9',
    signals: [
      { label: 'EEG O1-REF', sampleRateHz: 256, physicalMin: -200, physicalMax: 200, samples },
    ],
  });
}

describe('IdentifyingFieldsBlanker', () => {
  it.each([1, 7, 100, 255, 256, 4096])(
    'in %i-byte chunks, writes exactly what blankPatientField and blankRecordingField give on the whole file',
    async (chunkBytes) => {
      const original = generatedEdf();
      const expected = Buffer.from(original);
      blankPatientField(expected);
      blankRecordingField(expected);
      const out = await runThrough(original, chunkBytes);
      expect(out.equals(expected)).toBe(true);
      for (const secret of [
        'Invented_Name',
        'INVENTED-HOSP-77',
        'Tech_Invented_Person',
        'Amp-Model',
      ])
        expect(out.includes(Buffer.from(secret))).toBe(false);
      // EDF+ "unknown" subfields (Kemp & Olivan 2003), the recording's start date kept.
      expect(out.subarray(8, 15).toString('latin1')).toBe('X X X X');
      expect(out.subarray(88, 168).toString('latin1')).toBe(
        'Startdate 01-MAR-2024 X X X'.padEnd(80, ' '),
      );
    },
  );

  it('blanks bytes 8..167 of a stream shorter than the 256-byte fixed header', async () => {
    const short = Buffer.from(
      `0       Secret_Patient_Name${' '.repeat(60)}Startdate 01-MAR-2024 SECRET-HOSP`,
      'latin1',
    );
    const out = await runThrough(short, 5);
    expect(out.byteLength).toBe(short.byteLength);
    expect(out.subarray(0, 8).toString('latin1')).toBe('0       ');
    expect(out.subarray(8).toString('latin1').trim()).toBe('');
  });

  it('overwrites the identifying bytes in the chunks it was given', async () => {
    const original = Buffer.from(generatedEdf());
    const chunks = [original.subarray(0, 50), original.subarray(50, 120), original.subarray(120)];
    const out: Buffer[] = [];
    for await (const chunk of Readable.from(chunks).pipe(new IdentifyingFieldsBlanker())) {
      out.push(chunk as Buffer);
    }
    // Readable.from hands the same Buffer objects on: their bytes 8..167 are now spaces.
    expect(original.subarray(8, 168).toString('latin1').trim()).toBe('');
  });
});
