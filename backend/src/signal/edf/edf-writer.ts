/**
 * EDF/EDF+ writer (Kemp et al. 1992; Kemp & Olivan 2003), for tests and generated
 * demo data. Writes the whole file into one Uint8Array; refuses a spec it cannot write
 * exactly rather than writing a half-valid file.
 */
import { EdfFormatError } from './edf-format-error';
import { EDF_ANNOTATIONS_LABEL } from './edf-header';
import { formatEdfNumber } from './edf-numbers';
import type { EdfAnnotation, EdfHeader } from './edf.types';

export interface EdfWriteSignal {
  label: string;
  sampleRateHz: number;
  /** Physical value written as digitalMin; rounded to what fits 8 characters. */
  physicalMin: number;
  physicalMax: number;
  /** Default −32768. */
  digitalMin?: number;
  /** Default 32767. */
  digitalMax?: number;
  /** Default 'uV'. */
  physicalDimension?: string;
  transducer?: string;
  prefiltering?: string;
  /**
   * Physical values; length must be a whole number of records. Values outside
   * physicalMin..physicalMax are clipped to the range, as an amplifier saturates.
   */
  samples: Float32Array | Float64Array;
}

export interface EdfWriteSpec {
  /** Default 'EDF+C'. Plain 'EDF' cannot hold annotations. */
  format?: EdfHeader['format'];
  /** Default: EDF+ `X X X X` (all unknown, Kemp & Olivan 2003); EDF blank. */
  patientId?: string;
  /** Default: EDF+ `Startdate dd-MMM-yyyy X X X`; EDF blank. */
  recordingId?: string;
  /** Local start time, ISO `YYYY-MM-DDTHH:mm:ss`; EDF years 1985–2084 (EDF+ also later). */
  startDate: string;
  /** Default 1 s. sampleRateHz × recordDurationS must be a whole number for every signal. */
  recordDurationS?: number;
  signals: EdfWriteSignal[];
  /** Written as TALs in an `EDF Annotations` signal, each in the record holding its onset. */
  annotations?: readonly EdfAnnotation[];
  /** EDF+D only: start of each record in seconds after startDate (default contiguous). */
  recordStartsS?: readonly number[];
  /** Bytes reserved per record for TALs; default: just enough for the busiest record. */
  annotationBytesPerRecord?: number;
}

const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];
/** Bytes that delimit TALs and so cannot appear in a text (Kemp & Olivan 2003). */
const hasTalControl = (text: string): boolean =>
  [...text].some((c) => c === '\u0000' || c === '\u0014' || c === '\u0015');
const DEFAULT_DIGITAL_MIN = -32768;
const DEFAULT_DIGITAL_MAX = 32767;

interface PlannedSignal {
  label: string;
  transducer: string;
  physicalDimension: string;
  physicalMinText: string;
  physicalMaxText: string;
  digitalMin: number;
  digitalMax: number;
  prefiltering: string;
  samplesPerRecord: number;
  samples: Float32Array | Float64Array | null;
}

function fail(field: string, found: string, expected: string): never {
  throw new EdfFormatError(field, found, expected);
}

function numberText(value: number, width: number, field: string): string {
  const text = formatEdfNumber(value, width);
  if (text === null) fail(field, String(value), `a number that fits ${width} characters`);
  return text;
}

/** TAL numbers: decimal, no exponent (Kemp & Olivan 2003). */
function talNumber(value: number, field: string): string {
  const text = formatEdfNumber(Math.abs(value), 40);
  if (text === null) fail(field, String(value), 'a finite number of seconds');
  return text;
}

function parseIsoStart(startDate: string): {
  year: number;
  month: number;
  day: number;
  time: string;
} {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})$/.exec(startDate);
  if (!m) fail('startDate', `'${startDate}'`, "ISO 'YYYY-MM-DDTHH:mm:ss'");
  const [year, month, day, hour, minute, second] = m.slice(1).map(Number);
  const check = new Date(Date.UTC(year, month - 1, day, hour, minute, second));
  if (
    check.getUTCFullYear() !== year ||
    check.getUTCMonth() !== month - 1 ||
    check.getUTCDate() !== day ||
    hour > 23 ||
    minute > 59 ||
    second > 59
  ) {
    fail('startDate', `'${startDate}'`, 'a real calendar date and time');
  }
  return { year, month, day, time: `${m[4]}.${m[5]}.${m[6]}` };
}

/**
 * Writes a complete EDF/EDF+ file. Throws `EdfFormatError` (field, found, expected) for
 * a spec that cannot be written as valid EDF/EDF+.
 *
 * Digital value = round((physical − pmin) · (dmax − dmin) / (pmax − pmin) + dmin),
 * the inverse of Kemp et al. 1992's physical-value formula, clipped to dmin..dmax.
 */
export function writeEdf(spec: EdfWriteSpec): Uint8Array {
  const format = spec.format ?? 'EDF+C';
  const isEdfPlus = format !== 'EDF';
  const annotations = spec.annotations ?? [];
  if (!isEdfPlus && annotations.length > 0) {
    fail('annotations', `${annotations.length} annotations`, "none in plain EDF (use 'EDF+C')");
  }
  if (spec.signals.length === 0) fail('signals', 'none', 'at least one signal');
  const recordDurationS = spec.recordDurationS ?? 1;
  if (!(recordDurationS > 0)) fail('recordDurationS', String(recordDurationS), 'more than 0 s');
  const durationText = numberText(recordDurationS, 8, 'recordDurationS');
  const writtenDurationS = Number(durationText);

  const planned: PlannedSignal[] = [];
  let recordCount = -1;
  spec.signals.forEach((s, i) => {
    const name = `signals[${i}] ('${s.label}')`;
    const exactSpr = s.sampleRateHz * writtenDurationS;
    const samplesPerRecord = Math.round(exactSpr);
    if (!(samplesPerRecord >= 1) || Math.abs(exactSpr - samplesPerRecord) > 1e-9 * exactSpr) {
      fail(
        `${name} sampleRateHz`,
        `${s.sampleRateHz} Hz × ${writtenDurationS} s = ${exactSpr} samples per record`,
        'a whole number of samples per record (at least 1)',
      );
    }
    if (s.samples.length % samplesPerRecord !== 0) {
      fail(
        `${name} samples`,
        `${s.samples.length} samples`,
        `a multiple of ${samplesPerRecord} samples per record`,
      );
    }
    const count = s.samples.length / samplesPerRecord;
    if (recordCount === -1) recordCount = count;
    else if (count !== recordCount) {
      fail(`${name} samples`, `${count} records of data`, `${recordCount}, as in signals[0]`);
    }
    const digitalMin = s.digitalMin ?? DEFAULT_DIGITAL_MIN;
    const digitalMax = s.digitalMax ?? DEFAULT_DIGITAL_MAX;
    if (
      !Number.isInteger(digitalMin) ||
      !Number.isInteger(digitalMax) ||
      digitalMin < DEFAULT_DIGITAL_MIN ||
      digitalMax > DEFAULT_DIGITAL_MAX ||
      digitalMin >= digitalMax
    ) {
      fail(
        `${name} digital range`,
        `${digitalMin}..${digitalMax}`,
        'integers, −32768 ≤ min < max ≤ 32767',
      );
    }
    const physicalMinText = numberText(s.physicalMin, 8, `${name} physicalMin`);
    const physicalMaxText = numberText(s.physicalMax, 8, `${name} physicalMax`);
    if (Number(physicalMinText) === Number(physicalMaxText)) {
      fail(
        `${name} physical range`,
        `${physicalMinText}..${physicalMaxText}`,
        'two different values',
      );
    }
    planned.push({
      label: s.label,
      transducer: s.transducer ?? '',
      physicalDimension: s.physicalDimension ?? 'uV',
      physicalMinText,
      physicalMaxText,
      digitalMin,
      digitalMax,
      prefiltering: s.prefiltering ?? '',
      samplesPerRecord,
      samples: s.samples,
    });
  });
  if (recordCount < 1) fail('signals samples', '0 records of data', 'at least one record');

  const recordStartsS = planRecordStarts(spec, format, recordCount, writtenDurationS);
  let annotationRecords: Uint8Array[] = [];
  if (isEdfPlus) {
    annotationRecords = planAnnotationRecords(annotations, recordStartsS);
    const neededBytes = Math.max(...annotationRecords.map((b) => b.length));
    const bytesPerRecord = spec.annotationBytesPerRecord ?? neededBytes;
    if (bytesPerRecord < neededBytes) {
      fail('annotationBytesPerRecord', String(bytesPerRecord), `at least ${neededBytes} bytes`);
    }
    planned.push({
      label: EDF_ANNOTATIONS_LABEL,
      transducer: '',
      physicalDimension: '',
      // Not used for TAL bytes but must differ (Kemp & Olivan 2003).
      physicalMinText: '-1',
      physicalMaxText: '1',
      digitalMin: DEFAULT_DIGITAL_MIN,
      digitalMax: DEFAULT_DIGITAL_MAX,
      prefiltering: '',
      samplesPerRecord: Math.ceil(bytesPerRecord / 2),
      samples: null,
    });
  }

  const { year, month, day, time } = parseIsoStart(spec.startDate);
  if (year < 1985 || (year > 2084 && !isEdfPlus)) {
    fail('startDate', String(year), isEdfPlus ? 'a year from 1985' : 'a year 1985–2084 (EDF)');
  }
  const yy = year > 2084 ? 'yy' : String(year % 100).padStart(2, '0');
  const dd = String(day).padStart(2, '0');
  const mm = String(month).padStart(2, '0');
  const patientId = spec.patientId ?? (isEdfPlus ? 'X X X X' : '');
  const recordingId =
    spec.recordingId ?? (isEdfPlus ? `Startdate ${dd}-${MONTHS[month - 1]}-${year} X X X` : '');

  const ns = planned.length;
  const headerBytes = 256 * (1 + ns);
  const recordBytes = 2 * planned.reduce((sum, s) => sum + s.samplesPerRecord, 0);
  const out = new Uint8Array(headerBytes + recordCount * recordBytes);
  let pos = 0;
  const put = (text: string, width: number, field: string): void => {
    if (text.length > width) fail(field, `${text.length} characters`, `at most ${width}`);
    for (let i = 0; i < text.length; i++) {
      const c = text.charCodeAt(i);
      if (c < 0x20 || c > 0x7e) {
        fail(field, `character code ${c} at ${i}`, 'printable ASCII (0x20–0x7E)');
      }
      out[pos + i] = c;
    }
    out.fill(0x20, pos + text.length, pos + width);
    pos += width;
  };
  // Kemp et al. 1992, main header.
  put('0', 8, 'version');
  put(patientId, 80, 'patientId');
  put(recordingId, 80, 'recordingId');
  put(`${dd}.${mm}.${yy}`, 8, 'startDate');
  put(time, 8, 'startDate time');
  put(String(headerBytes), 8, 'header bytes');
  put(isEdfPlus ? format : '', 44, 'reserved');
  put(String(recordCount), 8, 'number of data records');
  put(durationText, 8, 'recordDurationS');
  put(String(ns), 4, 'number of signals');
  // Kemp et al. 1992, signal header: each field for all signals before the next field.
  const column = (width: number, field: string, value: (s: PlannedSignal) => string): void => {
    planned.forEach((s, i) => put(value(s), width, `signals[${i}] ${field}`));
  };
  column(16, 'label', (s) => s.label);
  column(80, 'transducer', (s) => s.transducer);
  column(8, 'physicalDimension', (s) => s.physicalDimension);
  column(8, 'physicalMin', (s) => s.physicalMinText);
  column(8, 'physicalMax', (s) => s.physicalMaxText);
  column(8, 'digitalMin', (s) => String(s.digitalMin));
  column(8, 'digitalMax', (s) => String(s.digitalMax));
  column(80, 'prefiltering', (s) => s.prefiltering);
  column(8, 'samples per record', (s) => String(s.samplesPerRecord));
  column(32, 'reserved', () => '');

  writeRecords(out, headerBytes, recordCount, planned, annotationRecords);
  return out;
}

function planRecordStarts(
  spec: EdfWriteSpec,
  format: EdfHeader['format'],
  recordCount: number,
  recordDurationS: number,
): number[] {
  if (format !== 'EDF+D') {
    if (spec.recordStartsS) fail('recordStartsS', 'given', "only with format 'EDF+D'");
    return Array.from({ length: recordCount }, (_, r) => r * recordDurationS);
  }
  const starts =
    spec.recordStartsS ?? Array.from({ length: recordCount }, (_, r) => r * recordDurationS);
  if (starts.length !== recordCount) {
    fail('recordStartsS', `${starts.length} starts`, `${recordCount}, one per data record`);
  }
  starts.forEach((t, r) => {
    if (!Number.isFinite(t)) fail(`recordStartsS[${r}]`, String(t), 'a finite number of seconds');
    if (r > 0 && t < starts[r - 1] + recordDurationS) {
      fail(
        `recordStartsS[${r}]`,
        `${t} s`,
        `at least ${starts[r - 1] + recordDurationS} s (EDF+D records may not overlap)`,
      );
    }
  });
  return [...starts];
}

/** TAL bytes for each record: time-keeping TAL first (Kemp & Olivan 2003), then its annotations. */
function planAnnotationRecords(
  annotations: readonly EdfAnnotation[],
  recordStartsS: readonly number[],
): Uint8Array[] {
  const encoder = new TextEncoder();
  const perRecord: string[] = recordStartsS.map(
    (t, r) => `${t < 0 ? '-' : '+'}${talNumber(t, `recordStartsS[${r}]`)}\x14\x14\x00`,
  );
  annotations.forEach((a, i) => {
    const field = `annotations[${i}]`;
    if (!Number.isFinite(a.onsetS)) fail(`${field} onsetS`, String(a.onsetS), 'a finite number');
    if (hasTalControl(a.text) || a.text.length === 0) {
      fail(`${field} text`, JSON.stringify(a.text), 'non-empty text without 0x00, 0x14 or 0x15');
    }
    let tal = `${a.onsetS < 0 ? '-' : '+'}${talNumber(a.onsetS, `${field} onsetS`)}`;
    if (a.durationS !== null) {
      if (!(a.durationS >= 0))
        fail(`${field} durationS`, String(a.durationS), 'at least 0 s or null');
      tal += `\x15${talNumber(a.durationS, `${field} durationS`)}`;
    }
    tal += `\x14${a.text}\x14\x00`;
    let record = 0;
    while (record + 1 < recordStartsS.length && recordStartsS[record + 1] <= a.onsetS) record++;
    perRecord[record] += tal;
  });
  return perRecord.map((text) => encoder.encode(text));
}

function writeRecords(
  out: Uint8Array,
  headerBytes: number,
  recordCount: number,
  planned: PlannedSignal[],
  annotationRecords: Uint8Array[],
): void {
  const view = new DataView(out.buffer, out.byteOffset, out.byteLength);
  let pos = headerBytes;
  for (let r = 0; r < recordCount; r++) {
    for (const [i, s] of planned.entries()) {
      const spr = s.samplesPerRecord;
      if (!s.samples) {
        // Unused annotation bytes stay 0x00 (Kemp & Olivan 2003); `out` starts zeroed.
        out.set(annotationRecords[r], pos);
        pos += 2 * spr;
        continue;
      }
      const pmin = Number(s.physicalMinText);
      const scale = (s.digitalMax - s.digitalMin) / (Number(s.physicalMaxText) - pmin);
      const base = r * spr;
      for (let k = 0; k < spr; k++) {
        const p = s.samples[base + k];
        if (!Number.isFinite(p)) {
          fail(`signals[${i}] ('${s.label}') samples[${base + k}]`, String(p), 'a finite number');
        }
        const d = Math.round((p - pmin) * scale + s.digitalMin);
        view.setInt16(
          pos,
          d < s.digitalMin ? s.digitalMin : d > s.digitalMax ? s.digitalMax : d,
          true,
        );
        pos += 2;
      }
    }
  }
}
