import { EdfFormatError } from './edf-format-error';
import { blankPatientField, blankRecordingField } from './edf-patient-field';
import { readEdf } from './edf-reader';
import { edfPlus, plainEdf } from './testing/hand-built-edf';

const text = (bytes: Uint8Array, from: number, to: number): string =>
  String.fromCharCode(...bytes.subarray(from, to));

describe('blankPatientField (writes in place)', () => {
  it("EDF+: patient field becomes 'X X X X' padded to 80 bytes, nothing else changes", () => {
    const original = edfPlus();
    const bytes = original.slice();
    blankPatientField(bytes);
    // Kemp & Olivan 2003: 'X' marks an unknown subfield (code, sex, birthdate, name).
    expect(text(bytes, 8, 88)).toBe('X X X X'.padEnd(80, ' '));
    // Kemp et al. 1992: patient field is bytes 8..87; every other byte stays.
    bytes.forEach((b, i) => {
      if (i < 8 || i >= 88) expect(b).toBe(original[i]);
    });
    const rec = readEdf(bytes);
    expect(rec.header.patientId).toBe('X X X X');
    expect(rec.header.recordingId).toBe('Startdate 02-MAR-2002 PSG-1234/2002 NN Telemetry03');
    expect(rec.warnings).toEqual([]);
  });

  it('plain EDF: patient field becomes 80 spaces', () => {
    const bytes = plainEdf();
    blankPatientField(bytes);
    expect(text(bytes, 8, 88)).toBe(' '.repeat(80));
    expect(readEdf(bytes).header.patientId).toBe('');
  });

  it('rejects a buffer shorter than the fixed header without writing', () => {
    const bytes = new Uint8Array(100);
    expect(() => blankPatientField(bytes)).toThrow(EdfFormatError);
    expect(bytes.every((b) => b === 0)).toBe(true);
  });
});

describe('blankRecordingField (writes in place)', () => {
  it('EDF+: keeps the Startdate subfield, X for the rest (Kemp & Olivan 2003)', () => {
    const bytes = edfPlus();
    blankRecordingField(bytes);
    expect(text(bytes, 88, 168)).toBe('Startdate 02-MAR-2002 X X X'.padEnd(80, ' '));
    expect(readEdf(bytes).header.startDate).toBe('2002-03-02T14:30:00');
  });

  it.each([
    ['free text in place of the date', 'Startdate Dr_Invented_Person HOSP-1 T1 EQ1'],
    ['a date in another format', 'Startdate 2002-03-02 HOSP-1 T1 EQ1'],
    ['no Startdate subfield', 'HOSP-1 Invented_Technician EQ1'],
    ['Startdate X with codes', 'Startdate X HOSP-1 Invented_Technician EQ1'],
  ])('EDF+: %s becomes Startdate X X X X (Kemp & Olivan 2003)', (_name, field) => {
    const bytes = edfPlus();
    for (let i = 0; i < 80; i++) bytes[88 + i] = field.padEnd(80, ' ').charCodeAt(i);
    blankRecordingField(bytes);
    expect(text(bytes, 88, 168)).toBe('Startdate X X X X'.padEnd(80, ' '));
  });

  it('EDF+: additional subfields after the equipment code are dropped', () => {
    const bytes = edfPlus();
    const field = 'Startdate 02-MAR-2002 HOSP-1 T1 EQ1 Invented_Extra_Note';
    for (let i = 0; i < 80; i++) bytes[88 + i] = field.padEnd(80, ' ').charCodeAt(i);
    blankRecordingField(bytes);
    expect(text(bytes, 88, 168)).toBe('Startdate 02-MAR-2002 X X X'.padEnd(80, ' '));
  });

  it('plain EDF: recording field becomes spaces', () => {
    const bytes = plainEdf();
    blankRecordingField(bytes);
    expect(text(bytes, 88, 168)).toBe(' '.repeat(80));
  });
});
