import { Readable } from 'node:stream';
import { blankPatientField, writeEdf } from '../../signal/edf';
import { PatientFieldBlanker } from './patient-field-blanker';

async function runThrough(bytes: Uint8Array, chunkBytes: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for (let i = 0; i < bytes.byteLength; i += chunkBytes) {
    chunks.push(Buffer.from(bytes.subarray(i, i + chunkBytes)));
  }
  const out: Buffer[] = [];
  for await (const chunk of Readable.from(chunks).pipe(new PatientFieldBlanker())) {
    out.push(chunk as Buffer);
  }
  return Buffer.concat(out);
}

/** Generated EDF+ file: 2 s of a ramp on one channel, with a made-up patient field. */
function generatedEdf(): Uint8Array {
  const samples = new Float32Array(512).map((_, i) => (i % 200) - 100);
  return writeEdf({
    startDate: '2024-03-01T10:00:00',
    patientId: 'MCH-0001 F 02-MAY-1951 Invented_Name',
    signals: [
      { label: 'EEG O1-REF', sampleRateHz: 256, physicalMin: -200, physicalMax: 200, samples },
    ],
  });
}

describe('PatientFieldBlanker', () => {
  it.each([1, 7, 100, 255, 256, 4096])(
    'in %i-byte chunks, writes exactly what blankPatientField gives on the whole file',
    async (chunkBytes) => {
      const original = generatedEdf();
      const expected = Buffer.from(original);
      blankPatientField(expected);
      const out = await runThrough(original, chunkBytes);
      expect(out.equals(expected)).toBe(true);
      expect(out.includes(Buffer.from('Invented_Name'))).toBe(false);
      // EDF+ "unknown" patient subfields (Kemp & Olivan 2003).
      expect(out.subarray(8, 15).toString('latin1')).toBe('X X X X');
    },
  );

  it('blanks bytes 8..87 of a stream shorter than the 256-byte fixed header', async () => {
    const short = Buffer.from(`0       Secret_Patient_Name${' '.repeat(40)}`, 'latin1');
    const out = await runThrough(short, 5);
    expect(out.byteLength).toBe(short.byteLength);
    expect(out.subarray(0, 8).toString('latin1')).toBe('0       ');
    expect(out.subarray(8).toString('latin1').trim()).toBe('');
  });
});
