/**
 * Blanking of identifying header fields before a file is stored.
 * Header layout from Kemp et al. 1992 (the same in BDF, BioSemi BDF format); EDF+ subfields
 * from Kemp & Olivan 2003, which BDF+ keeps (van Beelen, BDF+ format description).
 */
import { EdfFormatError } from './edf-format-error';

const PATIENT_OFFSET = 8;
const RECORDING_OFFSET = 88;
const FIELD_WIDTH = 80;
const RESERVED_OFFSET = 192;

/** EDF+ (reserved field `EDF+…`) or BDF+ (`BDF+…`): the patient and recording fields have subfields. */
function isPlusHeader(bytes: Uint8Array): boolean {
  const start = String.fromCharCode(...bytes.subarray(RESERVED_OFFSET, RESERVED_OFFSET + 4));
  return start === 'EDF+' || start === 'BDF+';
}

function writeField(bytes: Uint8Array, offset: number, text: string): void {
  const padded = text.padEnd(FIELD_WIDTH, ' ');
  for (let i = 0; i < FIELD_WIDTH; i++) bytes[offset + i] = padded.charCodeAt(i);
}

function assertHeader(bytes: Uint8Array): void {
  if (bytes.byteLength < 256) {
    throw new EdfFormatError(
      'file length',
      `${bytes.byteLength} bytes`,
      'at least 256 bytes (the fixed header)',
    );
  }
}

/**
 * Writes IN PLACE over the local patient identification (header bytes 8..87):
 * EDF+ and BDF+ get `X X X X` (code, sex, birthdate and name all unknown, Kemp & Olivan
 * 2003) padded with spaces, so the file stays valid EDF+/BDF+; plain EDF and BDF get 80 spaces.
 * The recording field (bytes 88..167) is left as is: see `blankRecordingField`.
 */
export function blankPatientField(bytes: Uint8Array): void {
  assertHeader(bytes);
  writeField(bytes, PATIENT_OFFSET, isPlusHeader(bytes) ? 'X X X X' : '');
}

/** `dd-MMM-yyyy` with an English month abbreviation in capitals (Kemp & Olivan 2003). */
const STARTDATE_SUBFIELD =
  /^Startdate ([0-9]{2}-(?:JAN|FEB|MAR|APR|MAY|JUN|JUL|AUG|SEP|OCT|NOV|DEC)-[0-9]{4})(?: |$)/;

/**
 * Writes IN PLACE over the local recording identification (header bytes 88..167),
 * which can name the hospital (admin code), technician and equipment. EDF+ and BDF+ get
 * `Startdate <date> X X X`: the mandatory `Startdate dd-MMM-yyyy` subfield, which holds
 * the year after 2084 (Kemp & Olivan 2003), is kept when it is a date and becomes `X`
 * (unknown) otherwise, so free text there is not kept either; the three code subfields
 * become `X` and any additional subfields are dropped. Plain EDF and BDF get spaces.
 */
export function blankRecordingField(bytes: Uint8Array): void {
  assertHeader(bytes);
  if (!isPlusHeader(bytes)) {
    writeField(bytes, RECORDING_OFFSET, '');
    return;
  }
  const current = String.fromCharCode(
    ...bytes.subarray(RECORDING_OFFSET, RECORDING_OFFSET + FIELD_WIDTH),
  );
  const startdate = STARTDATE_SUBFIELD.exec(current);
  writeField(bytes, RECORDING_OFFSET, `Startdate ${startdate ? startdate[1] : 'X'} X X X`);
}
