/**
 * EDF/EDF+ and BDF/BDF+ header parsing and validation, usable on the header bytes alone
 * while an upload streams (`readEdfHeader`). Layout from Kemp et al. 1992 ("A simple format
 * for exchange of digitized polygraphic recordings"); EDF+ meanings of the reserved,
 * patient and recording fields from Kemp & Olivan 2003. BDF is BioSemi's 24-bit variant of
 * the same layout (BioSemi, "BDF file format", biosemi.com/faq/file_format.htm): version
 * field 0xFF followed by `BIOSEMI`, reserved field `24BIT`, 3-byte samples. BDF+ is to BDF
 * what EDF+ is to EDF (van Beelen, "BDF+ format description", teuniz.net/edfbrowser):
 * reserved field `BDF+C` or `BDF+D`, TALs in a `BDF Annotations` signal.
 *
 * Every size the header claims is checked against the real byte length before the
 * reader allocates anything, so a lying header cannot make it allocate gigabytes.
 */
import { roiChannels } from '../channels/region-of-interest';
import { EdfFormatError } from './edf-format-error';
import { parseEdfInteger, parseEdfNumber } from './edf-numbers';
import type { EdfHeader, EdfHeaderInfo, EdfSignalHeader } from './edf.types';

/** The longest data record the reader accepts: 31 days (common practice: records last seconds). */
export const MAX_RECORDING_S = 31 * 86_400;

/** Fixed part of the header (Kemp et al. 1992). */
export const EDF_FIXED_HEADER_BYTES = 256;
/** Header bytes per signal (Kemp et al. 1992). */
export const EDF_BYTES_PER_SIGNAL_HEADER = 256;
/** Label of EDF+ annotation signals (Kemp & Olivan 2003). */
export const EDF_ANNOTATIONS_LABEL = 'EDF Annotations';
/** Label of BDF+ annotation signals (van Beelen, BDF+ format description). */
export const BDF_ANNOTATIONS_LABEL = 'BDF Annotations';
/** The 7 characters after the 0xFF byte of a BDF version field (BioSemi BDF format). */
const BDF_IDENTIFICATION = 'BIOSEMI';

/**
 * The two families of the format: EDF stores 16-bit samples (Kemp et al. 1992), BDF 24-bit
 * ones (BioSemi BDF format); the digital range follows from the width.
 */
const FAMILIES = {
  EDF: { sampleBytes: 2, digitalMin: -32768, digitalMax: 32767, bits: 16 },
  BDF: { sampleBytes: 3, digitalMin: -8388608, digitalMax: 8388607, bits: 24 },
} as const;
type Family = keyof typeof FAMILIES;
/**
 * The signal-count field is 4 ASCII characters (at most 9999, Kemp et al. 1992); the file
 * size bounds it further. This cap only keeps error messages about absurd counts short.
 */
const MAX_SIGNAL_COUNT = 9999;

/** Fixed header fields: [name used in errors, offset, width] (Kemp et al. 1992). */
const FIXED_FIELDS = {
  version: ['version', 0, 8],
  patientId: ['local patient identification', 8, 80],
  recordingId: ['local recording identification', 88, 80],
  startDate: ['start date', 168, 8],
  startTime: ['start time', 176, 8],
  headerBytes: ['header bytes', 184, 8],
  reserved: ['reserved', 192, 44],
  recordCount: ['number of data records', 236, 8],
  recordDuration: ['duration of a data record', 244, 8],
  signalCount: ['number of signals', 252, 4],
} as const;

/** Per-signal fields in header order with their widths (Kemp et al. 1992). */
const SIGNAL_FIELDS = [
  ['label', 16],
  ['transducer type', 80],
  ['physical dimension', 8],
  ['physical minimum', 8],
  ['physical maximum', 8],
  ['digital minimum', 8],
  ['digital maximum', 8],
  ['prefiltering', 80],
  ['number of samples in each data record', 8],
  ['reserved', 32],
] as const;

const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];

function ascii(bytes: Uint8Array, offset: number, width: number): string {
  let text = '';
  for (let i = offset; i < offset + width; i++) text += String.fromCharCode(bytes[i]);
  return text;
}

function fixedField(bytes: Uint8Array, key: keyof typeof FIXED_FIELDS): string {
  const [, offset, width] = FIXED_FIELDS[key];
  return ascii(bytes, offset, width);
}

/** Header fields hold printable US-ASCII only, 0x20..0x7E (Kemp et al. 1992; Kemp & Olivan 2003). */
function assertPrintable(bytes: Uint8Array, from: number, to: number, signalCount: number): void {
  for (let i = from; i < to; i++) {
    const b = bytes[i];
    if (b < 0x20 || b > 0x7e) {
      throw new EdfFormatError(
        `header byte ${i} (${describeHeaderOffset(i, signalCount)})`,
        `0x${b.toString(16).padStart(2, '0')}`,
        'printable ASCII (0x20–0x7E)',
      );
    }
  }
}

/** Names the header field that holds byte `offset`, for error messages. */
function describeHeaderOffset(offset: number, signalCount: number): string {
  if (offset < EDF_FIXED_HEADER_BYTES) {
    for (const [name, start, width] of Object.values(FIXED_FIELDS)) {
      if (offset >= start && offset < start + width) return name;
    }
  }
  let start = EDF_FIXED_HEADER_BYTES;
  for (const [name, width] of SIGNAL_FIELDS) {
    const blockBytes = width * signalCount;
    if (offset < start + blockBytes) {
      return `${name} of signal ${Math.floor((offset - start) / width) + 1}`;
    }
    start += blockBytes;
  }
  return 'signal header';
}

function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

function daysInMonth(year: number, month: number): number {
  return [31, isLeapYear(year) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1];
}

const pad2 = (n: number): string => String(n).padStart(2, '0');

/**
 * The EDF+ recording field's `Startdate dd-MMM-yyyy` subfield (Kemp & Olivan 2003), or
 * null when absent or `X` (unknown).
 */
function recordingFieldDate(
  recordingId: string,
): { day: number; month: number; year: number } | null {
  const m = /^Startdate ([0-9]{2})-([A-Z]{3})-([0-9]{4})(\s|$)/.exec(recordingId);
  if (!m) return null;
  const month = MONTHS.indexOf(m[2]) + 1;
  if (month === 0) return null;
  return { day: Number(m[1]), month, year: Number(m[3]) };
}

/**
 * Start date and time as ISO `YYYY-MM-DDTHH:mm:ss`.
 * Two-digit years: 85–99 → 19xx, 00–84 → 20xx (clipping date 1985, Kemp & Olivan 2003;
 * the same rule is used for plain EDF). EDF+ writes `yy` after 2084; the year then comes
 * from the recording field's `Startdate dd-MMM-yyyy` (Kemp & Olivan 2003).
 */
function parseStartDate(
  dateText: string,
  timeText: string,
  isEdfPlus: boolean,
  recordingId: string,
  warnings: string[],
): string {
  const dateField = FIXED_FIELDS.startDate[0];
  const timeField = FIXED_FIELDS.startTime[0];
  const dm = /^([0-9]{2})\.([0-9]{2})\.([0-9]{2}|yy)$/.exec(dateText.trim());
  if (!dm || (dm[3] === 'yy' && !isEdfPlus)) {
    throw new EdfFormatError(dateField, `'${dateText.trim()}'`, "'dd.mm.yy'");
  }
  const day = Number(dm[1]);
  const month = Number(dm[2]);
  const recordingDate = isEdfPlus ? recordingFieldDate(recordingId) : null;
  let year: number;
  if (dm[3] === 'yy') {
    if (!recordingDate || recordingDate.year < 2085) {
      throw new EdfFormatError(
        FIXED_FIELDS.recordingId[0],
        recordingDate ? `Startdate year ${recordingDate.year}` : 'no Startdate dd-MMM-yyyy',
        "a year after 2084 in 'Startdate dd-MMM-yyyy' (the start date year is 'yy')",
      );
    }
    year = recordingDate.year;
  } else {
    const yy = Number(dm[3]);
    year = yy >= 85 ? 1900 + yy : 2000 + yy;
  }
  if (month < 1 || month > 12) {
    throw new EdfFormatError(`${dateField} month`, `'${dm[2]}'`, '01–12');
  }
  if (day < 1 || day > daysInMonth(year, month)) {
    throw new EdfFormatError(
      `${dateField} day`,
      `'${dm[1]}'`,
      `01–${daysInMonth(year, month)} for ${year}-${pad2(month)}`,
    );
  }
  const tm = /^([0-9]{2})\.([0-9]{2})\.([0-9]{2})$/.exec(timeText.trim());
  if (!tm) throw new EdfFormatError(timeField, `'${timeText.trim()}'`, "'hh.mm.ss'");
  const [hour, minute, second] = [Number(tm[1]), Number(tm[2]), Number(tm[3])];
  if (hour > 23 || minute > 59 || second > 59) {
    throw new EdfFormatError(timeField, `'${timeText.trim()}'`, 'hh 00–23, mm 00–59, ss 00–59');
  }
  if (
    recordingDate &&
    (recordingDate.year !== year || recordingDate.month !== month || recordingDate.day !== day)
  ) {
    warnings.push(
      `EDF+ recording field says Startdate ${recordingDate.year}-${pad2(recordingDate.month)}-${pad2(recordingDate.day)} but the start date field says ${year}-${pad2(month)}-${pad2(day)}; the start date field is used.`,
    );
  }
  return `${year}-${pad2(month)}-${pad2(day)}T${pad2(hour)}:${pad2(minute)}:${pad2(second)}`;
}

/**
 * Number of header bytes to read before `readEdfHeader` can run, from the first 256
 * bytes: 256 × (1 + number of signals) (Kemp et al. 1992). Validates the version and
 * signal-count fields on the way.
 */
export function requiredHeaderBytes(firstBytes: Uint8Array): number {
  if (firstBytes.byteLength < EDF_FIXED_HEADER_BYTES) {
    throw new EdfFormatError(
      'file length',
      `${firstBytes.byteLength} bytes`,
      `at least ${EDF_FIXED_HEADER_BYTES} bytes (the fixed header)`,
    );
  }
  checkVersion(firstBytes);
  return EDF_FIXED_HEADER_BYTES * (1 + parseSignalCount(firstBytes));
}

const VERSION_EXPECTED = "'0' (EDF) or 0xFF 'BIOSEMI' (BDF)";

/**
 * The family the version field names: `0` padded with spaces is EDF (Kemp et al. 1992);
 * the byte 0xFF followed by `BIOSEMI` is BDF (BioSemi BDF format). The bytes decide, never
 * the file name.
 */
function checkVersion(bytes: Uint8Array): Family {
  if (bytes[0] === 0xff) {
    if (ascii(bytes, 1, 7) === BDF_IDENTIFICATION) return 'BDF';
    throw new EdfFormatError('version', `0xFF followed by ${shown(bytes, 1, 8)}`, VERSION_EXPECTED);
  }
  assertPrintable(bytes, 0, 8, 0);
  const version = fixedField(bytes, 'version');
  if (version.trim() !== '0') {
    throw new EdfFormatError('version', `'${version.trim()}'`, VERSION_EXPECTED);
  }
  return 'EDF';
}

/** Bytes as quoted text, with bytes outside printable ASCII as \\xNN, for error messages. */
function shown(bytes: Uint8Array, from: number, to: number): string {
  let text = '';
  for (let i = from; i < to; i++) {
    const b = bytes[i];
    text +=
      b >= 0x20 && b <= 0x7e ? String.fromCharCode(b) : `\\x${b.toString(16).padStart(2, '0')}`;
  }
  return `'${text}'`;
}

function parseSignalCount(bytes: Uint8Array): number {
  assertPrintable(bytes, 252, 256, 0);
  const name = FIXED_FIELDS.signalCount[0];
  const count = parseEdfInteger(fixedField(bytes, 'signalCount'), name);
  if (count < 1 || count > MAX_SIGNAL_COUNT) {
    throw new EdfFormatError(name, String(count), `1–${MAX_SIGNAL_COUNT}`);
  }
  return count;
}

/**
 * Checks of the fixed 256-byte header that need nothing else: version, printable
 * ASCII, signal count, header-bytes field, and that the header fits `fileSizeBytes`
 * (Kemp et al. 1992). Returns the full header length to read next.
 */
export function checkFixedHeader(headerBytes: Uint8Array, fileSizeBytes: number): number {
  if (fileSizeBytes < EDF_FIXED_HEADER_BYTES || headerBytes.byteLength < EDF_FIXED_HEADER_BYTES) {
    throw new EdfFormatError(
      'file length',
      `${Math.min(fileSizeBytes, headerBytes.byteLength)} bytes`,
      `at least ${EDF_FIXED_HEADER_BYTES} bytes (the fixed header)`,
    );
  }
  const family = checkVersion(headerBytes);
  const signalCount = parseSignalCount(headerBytes);
  const expectedHeaderBytes = EDF_FIXED_HEADER_BYTES * (1 + signalCount);
  // BDF's first byte is 0xFF by definition; every other header byte is ASCII in both.
  assertPrintable(headerBytes, family === 'BDF' ? 1 : 0, EDF_FIXED_HEADER_BYTES, signalCount);

  const headerBytesField = parseEdfInteger(fixedField(headerBytes, 'headerBytes'), 'header bytes');
  if (headerBytesField !== expectedHeaderBytes) {
    throw new EdfFormatError(
      'header bytes',
      String(headerBytesField),
      `256 × (1 + ${signalCount} signals) = ${expectedHeaderBytes}`,
    );
  }
  if (fileSizeBytes < expectedHeaderBytes) {
    throw new EdfFormatError(
      'file length',
      `${fileSizeBytes} bytes`,
      `at least the header's 256 × (1 + ${signalCount} signals) = ${expectedHeaderBytes} bytes`,
    );
  }
  return expectedHeaderBytes;
}

/**
 * Reads and validates the whole header (fixed part and signal headers) and checks the
 * sizes it claims against `fileSizeBytes`. Throws `EdfFormatError` on the first
 * problem; collects non-fatal ones in `warnings`.
 *
 * @param headerBytes at least the first 256 × (1 + signals) bytes of the file (more is fine).
 * @param fileSizeBytes length of the whole file in bytes.
 */
export function readEdfHeader(headerBytes: Uint8Array, fileSizeBytes: number): EdfHeaderInfo {
  const warnings: string[] = [];
  const expectedHeaderBytes = checkFixedHeader(headerBytes, fileSizeBytes);
  const family = checkVersion(headerBytes);
  const signalCount = expectedHeaderBytes / EDF_BYTES_PER_SIGNAL_HEADER - 1;
  if (headerBytes.byteLength < expectedHeaderBytes) {
    throw new EdfFormatError(
      'header bytes given',
      String(headerBytes.byteLength),
      `${expectedHeaderBytes} (read checkFixedHeader's length first)`,
    );
  }
  assertPrintable(headerBytes, EDF_FIXED_HEADER_BYTES, expectedHeaderBytes, signalCount);

  const reserved = fixedField(headerBytes, 'reserved').trimEnd();
  const format = formatOf(family, reserved, warnings);
  const isPlus = isPlusFormat(format);

  const patientId = fixedField(headerBytes, 'patientId').trimEnd();
  const recordingId = fixedField(headerBytes, 'recordingId').trimEnd();
  if (isPlus && patientId.trim().split(/\s+/).length < 4) {
    warnings.push(
      `${family}+ patient field does not have the four subfields (code sex birthdate name) of Kemp & Olivan 2003.`,
    );
  }
  const startDate = parseStartDate(
    fixedField(headerBytes, 'startDate'),
    fixedField(headerBytes, 'startTime'),
    isPlus,
    recordingId,
    warnings,
  );

  const recordCountName = FIXED_FIELDS.recordCount[0];
  const recordCountField = parseEdfInteger(fixedField(headerBytes, 'recordCount'), recordCountName);
  if (recordCountField < 1 && recordCountField !== -1) {
    throw new EdfFormatError(
      recordCountName,
      String(recordCountField),
      'at least 1 (or -1 while recording)',
    );
  }
  const durationName = FIXED_FIELDS.recordDuration[0];
  const recordDurationS = parseEdfNumber(fixedField(headerBytes, 'recordDuration'), durationName);
  if (recordDurationS <= 0) {
    throw new EdfFormatError(durationName, `${recordDurationS} s`, 'more than 0 s');
  }
  // Finite but absurd (9.9e307 s) makes every time in the file infinite: a broken header.
  if (recordDurationS > MAX_RECORDING_S) {
    throw new EdfFormatError(
      durationName,
      `${recordDurationS} s`,
      `at most ${MAX_RECORDING_S} s (${MAX_RECORDING_S / 86_400} days)`,
    );
  }

  const annotationsLabel = family === 'BDF' ? BDF_ANNOTATIONS_LABEL : EDF_ANNOTATIONS_LABEL;
  const signalHeaders = parseSignalHeaders(
    headerBytes,
    signalCount,
    recordDurationS,
    annotationsLabel,
  );
  const annotationSignalIndices: number[] = [];
  signalHeaders.forEach((s, i) => {
    if (s.label === annotationsLabel) annotationSignalIndices.push(i);
  });
  if (isPlus && annotationSignalIndices.length === 0) {
    throw new EdfFormatError(
      `'${annotationsLabel}' signal`,
      'none',
      `at least one in ${format} (it holds the time-keeping TAL of each data record)`,
    );
  }
  if (!isPlus && annotationSignalIndices.length > 0) {
    warnings.push(`Plain ${format} file has an '${annotationsLabel}' signal; read as TALs.`);
  }
  for (const [i, s] of signalHeaders.entries()) {
    if (annotationSignalIndices.includes(i)) continue;
    validateOrdinarySignal(s, i, family);
  }

  const { sampleBytes } = FAMILIES[family];
  const recordBytes = sampleBytes * signalHeaders.reduce((sum, s) => sum + s.samplesPerRecord, 0);
  let recordCount = recordCountField;
  if (recordCountField === -1) {
    recordCount = recordCountFromSize(fileSizeBytes, expectedHeaderBytes, recordBytes);
    warnings.push(
      `The number of data records is -1 (the file was closed while recording); ${recordCount} records of ${recordBytes} bytes were counted from the file size.`,
    );
  }
  checkFileSize(fileSizeBytes, expectedHeaderBytes, recordBytes, recordCount);

  const ordinaryLabels = signalHeaders
    .filter((_, i) => !annotationSignalIndices.includes(i))
    .map((s) => s.label);
  if (roiChannels(ordinaryLabels).length === 0) {
    warnings.push(
      'No EEG channel of the posterior region of interest (O1, O2, Oz, POz, PO3, PO4, PO7, PO8, Pz, P3, P4) was found.',
    );
  }

  const header: EdfHeader = {
    version:
      family === 'BDF' ? `0xFF ${BDF_IDENTIFICATION}` : fixedField(headerBytes, 'version').trim(),
    patientId,
    recordingId,
    startDate,
    headerBytes: expectedHeaderBytes,
    reserved,
    format,
    recordCount,
    recordDurationS,
    signalCount,
  };
  return { header, signalHeaders, annotationSignalIndices, recordBytes, sampleBytes, warnings };
}

/** True for the formats with annotations and record times: EDF+C/D and BDF+C/D. */
export function isPlusFormat(format: EdfHeader['format']): boolean {
  return format.endsWith('+C') || format.endsWith('+D');
}

/**
 * The format the reserved field names within the version's family. EDF: `EDF+C`/`EDF+D`
 * (Kemp & Olivan 2003), otherwise plain EDF (other text only warns, as in files written
 * before EDF+). BDF: `24BIT` (BioSemi BDF format) or `BDF+C`/`BDF+D` (BDF+), nothing else,
 * and neither of these in a file whose version says EDF: its samples would be misread.
 */
function formatOf(family: Family, reserved: string, warnings: string[]): EdfHeader['format'] {
  const name = FIXED_FIELDS.reserved[0];
  if (family === 'BDF') {
    if (reserved.startsWith('24BIT')) return 'BDF';
    if (reserved.startsWith('BDF+C')) return 'BDF+C';
    if (reserved.startsWith('BDF+D')) return 'BDF+D';
    throw new EdfFormatError(
      name,
      `'${reserved}' in a BDF file (version 0xFF 'BIOSEMI')`,
      "'24BIT' (BDF) or 'BDF+C' / 'BDF+D' (BDF+)",
    );
  }
  if (reserved.startsWith('EDF+C')) return 'EDF+C';
  if (reserved.startsWith('EDF+D')) return 'EDF+D';
  if (reserved.startsWith('EDF+')) {
    throw new EdfFormatError(name, `'${reserved}'`, "'EDF+C' or 'EDF+D' (EDF+) or spaces (EDF)");
  }
  if (reserved.startsWith('24BIT') || reserved.startsWith('BDF+')) {
    throw new EdfFormatError(
      name,
      `'${reserved}' in an EDF file (version '0')`,
      "'EDF+C', 'EDF+D' or spaces, or the BDF version field 0xFF 'BIOSEMI' for 24-bit samples",
    );
  }
  if (reserved.length > 0) {
    warnings.push(`Reserved header field is not blank ('${reserved}'); read as plain EDF.`);
  }
  return 'EDF';
}

/**
 * The record count of a file whose header says -1, which EDF+ allows while the file is still
 * being recorded (Kemp & Olivan 2003): the bytes after the header, when they are a whole
 * number of data records (at least one). Anything else is refused, naming both numbers.
 */
function recordCountFromSize(
  fileSizeBytes: number,
  headerBytes: number,
  recordBytes: number,
): number {
  const dataBytes = fileSizeBytes - headerBytes;
  if (dataBytes > 0 && dataBytes % recordBytes === 0) return dataBytes / recordBytes;
  throw new EdfFormatError(
    FIXED_FIELDS.recordCount[0],
    `-1 (unknown, written while recording) with ${dataBytes} bytes after the header`,
    `bytes after the header that are a whole number (at least 1) of data records of ${recordBytes} bytes`,
  );
}

function parseSignalHeaders(
  bytes: Uint8Array,
  signalCount: number,
  recordDurationS: number,
  annotationsLabel: string,
): EdfSignalHeader[] {
  const columns: string[][] = [];
  let offset = EDF_FIXED_HEADER_BYTES;
  for (const [, width] of SIGNAL_FIELDS) {
    const column: string[] = [];
    for (let i = 0; i < signalCount; i++) column.push(ascii(bytes, offset + i * width, width));
    columns.push(column);
    offset += width * signalCount;
  }
  const signals: EdfSignalHeader[] = [];
  for (let i = 0; i < signalCount; i++) {
    const label = columns[0][i].trim();
    const name = (field: number): string =>
      `signal ${i + 1} ('${label}') ${SIGNAL_FIELDS[field][0]}`;
    const isAnnotation = label === annotationsLabel;
    // Annotation signals carry TAL bytes, not numbers; their ranges are not used.
    const range = (field: number, parse: (text: string, name: string) => number): number =>
      isAnnotation ? Number(columns[field][i].trim()) : parse(columns[field][i], name(field));
    const samplesPerRecord = parseEdfInteger(columns[8][i], name(8));
    if (samplesPerRecord <= 0) {
      throw new EdfFormatError(name(8), String(samplesPerRecord), 'at least 1');
    }
    signals.push({
      label,
      transducer: columns[1][i].trim(),
      physicalDimension: columns[2][i].trim(),
      physicalMin: range(3, parseEdfNumber),
      physicalMax: range(4, parseEdfNumber),
      digitalMin: range(5, parseEdfInteger),
      digitalMax: range(6, parseEdfInteger),
      prefiltering: columns[7][i].trim(),
      samplesPerRecord,
      sampleRateHz: samplesPerRecord / recordDurationS,
    });
  }
  return signals;
}

function validateOrdinarySignal(s: EdfSignalHeader, index: number, family: Family): void {
  const prefix = `signal ${index + 1} ('${s.label}')`;
  const { digitalMin: lowest, digitalMax: highest, bits } = FAMILIES[family];
  for (const [name, value] of [
    ['digital minimum', s.digitalMin],
    ['digital maximum', s.digitalMax],
  ] as const) {
    if (value < lowest || value > highest) {
      throw new EdfFormatError(
        `${prefix} ${name}`,
        String(value),
        `${lowest}–${highest} (${bits}-bit ${family})`,
      );
    }
  }
  if (s.digitalMin >= s.digitalMax) {
    throw new EdfFormatError(
      `${prefix} digital minimum`,
      `${s.digitalMin} (maximum ${s.digitalMax})`,
      'less than the digital maximum',
    );
  }
  if (s.physicalMin === s.physicalMax) {
    throw new EdfFormatError(
      `${prefix} physical minimum`,
      `${s.physicalMin} (maximum ${s.physicalMax})`,
      'a value different from the physical maximum',
    );
  }
}

function checkFileSize(
  fileSizeBytes: number,
  headerBytes: number,
  recordBytes: number,
  recordCount: number,
): void {
  const dataBytes = fileSizeBytes - headerBytes;
  const expectedFileBytes = headerBytes + recordCount * recordBytes;
  if (dataBytes < recordCount * recordBytes) {
    const completeRecords = Math.floor(dataBytes / recordBytes);
    const partialBytes = dataBytes - completeRecords * recordBytes;
    if (partialBytes > 0) {
      throw new EdfFormatError(
        'data records',
        `file ends ${partialBytes} bytes into record ${completeRecords + 1} of ${recordCount}`,
        `${recordBytes} bytes per record`,
        'truncated last record',
      );
    }
    throw new EdfFormatError(
      'number of data records',
      String(recordCount),
      `${completeRecords}, as the file holds ${completeRecords} records of ${recordBytes} bytes`,
    );
  }
  if (fileSizeBytes !== expectedFileBytes) {
    throw new EdfFormatError(
      'file length',
      `${fileSizeBytes} bytes`,
      `${headerBytes} header + ${recordCount} records × ${recordBytes} bytes = ${expectedFileBytes} bytes`,
    );
  }
}
