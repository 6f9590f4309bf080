/**
 * Test data, generated: EDF/EDF+ files assembled byte by byte from literal field texts,
 * following the layout of Kemp et al. 1992 (header) and Kemp & Olivan 2003 (EDF+
 * reserved field, TALs). Nothing here uses Gyre's writer or number formatting, so the
 * reader is checked against the specification rather than against the writer.
 */
import { FIXED_FIELDS, SIGNAL_FIELDS } from './edf-field-layout';

/** Fixed header fields as the literal text to write (padded with spaces to the width). */
export interface RawFixedFields {
  version: string; // 8 ascii
  patient: string; // 80 ascii
  recording: string; // 80 ascii
  startDate: string; // 8 ascii dd.mm.yy
  startTime: string; // 8 ascii hh.mm.ss
  headerBytes: string; // 8 ascii
  reserved: string; // 44 ascii
  recordCount: string; // 8 ascii
  recordDuration: string; // 8 ascii
  signalCount: string; // 4 ascii
}

/** Per-signal fields as literal text (Kemp et al. 1992 widths in the comments). */
export interface RawSignalFields {
  label: string; // 16
  transducer: string; // 80
  dimension: string; // 8
  physicalMin: string; // 8
  physicalMax: string; // 8
  digitalMin: string; // 8
  digitalMax: string; // 8
  prefiltering: string; // 80
  samplesPerRecord: string; // 8
  reserved: string; // 32
}

/** `text` as `width` bytes, space-padded; a too-long text is a bug in the test. */
export function field(text: string, width: number): number[] {
  if (text.length > width) throw new Error(`test fixture: '${text}' longer than ${width}`);
  const out: number[] = [];
  for (let i = 0; i < width; i++) out.push(i < text.length ? text.charCodeAt(i) : 0x20);
  return out;
}

export function rawHeader(fixed: RawFixedFields, signals: RawSignalFields[]): number[] {
  const bytes: number[] = [];
  for (const [name, , width] of FIXED_FIELDS) bytes.push(...field(fixed[name], width));
  for (const [name, width] of SIGNAL_FIELDS)
    for (const s of signals) bytes.push(...field(s[name], width));
  return bytes;
}

/** 16-bit little-endian two's complement (Kemp et al. 1992), written byte by byte. */
export function int16le(values: number[]): number[] {
  const out: number[] = [];
  for (const v of values) {
    const u = v < 0 ? v + 65536 : v;
    out.push(u & 0xff, (u >> 8) & 0xff);
  }
  return out;
}

/** Bytes of an ASCII/UTF-8 TAL text padded with 0x00 to `length` bytes (Kemp & Olivan 2003). */
export function talBytes(tal: string, length: number): number[] {
  const encoded = Array.from(new TextEncoder().encode(tal));
  if (encoded.length > length) throw new Error(`test fixture: TAL longer than ${length} bytes`);
  return [...encoded, ...new Array<number>(length - encoded.length).fill(0)];
}

export function eegSignal(label: string, samplesPerRecord: number): RawSignalFields {
  return {
    label,
    transducer: 'AgAgCl electrode',
    dimension: 'uV',
    physicalMin: '-200',
    physicalMax: '200',
    digitalMin: '-2048',
    digitalMax: '2047',
    prefiltering: 'HP:0.1Hz LP:75Hz',
    samplesPerRecord: String(samplesPerRecord),
    reserved: '',
  };
}

export function annotationSignal(samplesPerRecord: number): RawSignalFields {
  return {
    label: 'EDF Annotations',
    transducer: '',
    dimension: '',
    physicalMin: '-1',
    physicalMax: '1',
    digitalMin: '-32768',
    digitalMax: '32767',
    prefiltering: '',
    samplesPerRecord: String(samplesPerRecord),
    reserved: '',
  };
}

/**
 * A plain EDF file: 3 records of 1 s, 'EEG O1-REF' at 4 Hz and 'Pz' at 2 Hz (different
 * rates), digital values chosen to hit dmin, dmax and zero.
 */
export function plainEdfParts(): {
  fixed: RawFixedFields;
  signals: RawSignalFields[];
  data: number[];
} {
  const signals = [eegSignal('EEG O1-REF', 4), eegSignal('Pz', 2)];
  const fixed: RawFixedFields = {
    version: '0',
    patient: 'P-0042 M 02-MAR-1951 Some_Name',
    recording: 'Startdate 14-JUL-1999 lab tech amp',
    startDate: '14.07.99',
    startTime: '08.05.30',
    headerBytes: '768',
    reserved: '',
    recordCount: '3',
    recordDuration: '1',
    signalCount: '2',
  };
  const data = [
    // record 1: O1 (4 samples) then Pz (2 samples), Kemp et al. 1992 record layout
    ...int16le([-2048, 2047, 0, -1]),
    ...int16le([100, -100]),
    // record 2
    ...int16le([1, 2, 3, 4]),
    ...int16le([2047, -2048]),
    // record 3
    ...int16le([-5, -6, -7, -8]),
    ...int16le([0, 1]),
  ];
  return { fixed, signals, data };
}

export function plainEdf(): Uint8Array {
  const { fixed, signals, data } = plainEdfParts();
  return Uint8Array.from([...rawHeader(fixed, signals), ...data]);
}

/**
 * An EDF+C file: 2 records of 0.5 s, 'O2' at 8 Hz, one 'EDF Annotations' signal of
 * 30 samples (60 bytes) per record holding time-keeping TALs and annotations.
 */
export function edfPlusParts(
  talsPerRecord: string[] = [
    '+0\x14\x14\x00+0.25\x150.1\x14Stim A\x14\x00',
    '+0.5\x14\x14\x00+0.75\x14Lights off\x14Close door\x14\x00-0.5\x14Reiz \u00f6 \u00b5\x14\x00',
  ],
  reserved = 'EDF+C',
): { fixed: RawFixedFields; signals: RawSignalFields[]; data: number[] } {
  const signals = [eegSignal('EEG O2-REF', 4), annotationSignal(30)];
  const fixed: RawFixedFields = {
    version: '0',
    patient: 'MCH-0234567 F 02-MAY-1951 Haagse_Harry',
    recording: 'Startdate 02-MAR-2002 PSG-1234/2002 NN Telemetry03',
    startDate: '02.03.02',
    startTime: '14.30.00',
    headerBytes: '768',
    reserved,
    recordCount: String(talsPerRecord.length),
    recordDuration: '0.5',
    signalCount: '2',
  };
  const data: number[] = [];
  talsPerRecord.forEach((tal, r) => {
    data.push(...int16le([r, r + 1, r + 2, r + 3]), ...talBytes(tal, 60));
  });
  return { fixed, signals, data };
}

export function edfPlus(...args: Parameters<typeof edfPlusParts>): Uint8Array {
  const { fixed, signals, data } = edfPlusParts(...args);
  return Uint8Array.from([...rawHeader(fixed, signals), ...data]);
}

export function assemble(parts: {
  fixed: RawFixedFields;
  signals: RawSignalFields[];
  data: number[];
}): Uint8Array {
  return Uint8Array.from([...rawHeader(parts.fixed, parts.signals), ...parts.data]);
}
