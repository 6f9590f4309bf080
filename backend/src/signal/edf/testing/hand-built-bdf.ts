/**
 * Test data, generated: BDF and BDF+ files assembled byte by byte from literal field texts.
 * BDF (BioSemi, "BDF file format", biosemi.com/faq/file_format.htm) has EDF's header layout
 * (Kemp et al. 1992) with the version field 0xFF + `BIOSEMI`, the reserved field `24BIT` and
 * 3-byte little-endian two's-complement samples; BDF+ (van Beelen, "BDF+ format description",
 * teuniz.net/edfbrowser) adds EDF+'s reserved `BDF+C`/`BDF+D` and TALs (Kemp & Olivan 2003) in
 * a `BDF Annotations` signal whose bytes are 3 × its samples per record. Nothing here uses
 * Gyre's writer, so the reader is checked against the format's description.
 */
import {
  edfPlusParts,
  field,
  rawHeader,
  talBytes,
  type RawFixedFields,
  type RawSignalFields,
} from './hand-built-edf';

/** The version field: the byte 0xFF, then `BIOSEMI` (BioSemi BDF format); `field` writes U+00FF as 0xFF. */
export const BDF_VERSION = '\u00ffBIOSEMI';

/** 24-bit little-endian two's complement (BioSemi BDF format), written byte by byte. */
export function int24le(values: number[]): number[] {
  const out: number[] = [];
  for (const v of values) {
    if (!Number.isInteger(v) || v < -8388608 || v > 8388607) {
      throw new Error(`test fixture: ${v} is not a 24-bit integer`);
    }
    const u = v < 0 ? v + 16777216 : v;
    out.push(u & 0xff, (u >> 8) & 0xff, (u >> 16) & 0xff);
  }
  return out;
}

/** An EEG signal with BioSemi's usual ranges: ±262144 µV over the full 24-bit range. */
export function bdfEegSignal(label: string, samplesPerRecord: number): RawSignalFields {
  return {
    label,
    transducer: 'Active Electrode',
    dimension: 'uV',
    physicalMin: '-262144',
    physicalMax: '262143',
    digitalMin: '-8388608',
    digitalMax: '8388607',
    prefiltering: 'HP:DC; LP:417 Hz',
    samplesPerRecord: String(samplesPerRecord),
    reserved: '',
  };
}

export function bdfAnnotationSignal(samplesPerRecord: number): RawSignalFields {
  return {
    label: 'BDF Annotations',
    transducer: '',
    dimension: '',
    physicalMin: '-1',
    physicalMax: '1',
    digitalMin: '-8388608',
    digitalMax: '8388607',
    prefiltering: '',
    samplesPerRecord: String(samplesPerRecord),
    reserved: '',
  };
}

export interface BdfParts {
  fixed: RawFixedFields;
  signals: RawSignalFields[];
  data: number[];
}

/** Digital values of the plain BDF file: the 24-bit extremes, zero, −1 and values > 16 bits. */
export const PLAIN_BDF_O1 = [
  [-8388608, 8388607, 0, -1],
  [0x123456, -0x123456, 65536, -65537],
  [1, -2, 8388606, -8388607],
];
export const PLAIN_BDF_PZ = [
  [100, -100],
  [8388607, -8388608],
  [0, 32768],
];

/**
 * A plain BDF file (`24BIT`): 3 records of 1 s, 'EEG O1-REF' at 4 Hz and 'Pz' at 2 Hz,
 * digital values from `PLAIN_BDF_O1` and `PLAIN_BDF_PZ` (record by record, signal by signal).
 */
export function plainBdfParts(): BdfParts {
  const signals = [bdfEegSignal('EEG O1-REF', 4), bdfEegSignal('Pz', 2)];
  const fixed: RawFixedFields = {
    version: BDF_VERSION,
    patient: 'P-0042 M 02-MAR-1951 Some_Name',
    recording: 'Startdate 14-JUL-1999 lab tech amp',
    startDate: '14.07.99',
    startTime: '08.05.30',
    headerBytes: '768',
    reserved: '24BIT',
    recordCount: '3',
    recordDuration: '1',
    signalCount: '2',
  };
  const data: number[] = [];
  for (let r = 0; r < 3; r++) data.push(...int24le(PLAIN_BDF_O1[r]), ...int24le(PLAIN_BDF_PZ[r]));
  return { fixed, signals, data };
}

/** A TAL text padded with 0x00 to `length` bytes (Kemp & Olivan 2003), as in EDF+. */
export const bdfTalBytes = talBytes;

/**
 * A BDF+ file: 2 records of 0.5 s, 'EEG O2-REF' at 8 Hz, one 'BDF Annotations' signal of 20
 * "samples" (60 bytes) per record holding the time-keeping TAL and annotations.
 */
export function bdfPlusParts(
  talsPerRecord: string[] = [
    '+0\x14\x14\x00+0.25\x150.1\x14Stim A\x14\x00',
    '+0.5\x14\x14\x00+0.75\x14Lights off\x14\x00',
  ],
  reserved = 'BDF+C',
): BdfParts {
  const signals = [bdfEegSignal('EEG O2-REF', 4), bdfAnnotationSignal(20)];
  // EDF+'s example header (hand-built-edf.ts) with BDF's version field and reserved field.
  const fixed: RawFixedFields = {
    ...edfPlusParts(talsPerRecord).fixed,
    version: BDF_VERSION,
    reserved,
  };
  const data: number[] = [];
  talsPerRecord.forEach((tal, r) => {
    data.push(
      ...int24le([r * 1000, -r * 1000, 4000000 + r, -4000000 - r]),
      ...bdfTalBytes(tal, 60),
    );
  });
  return { fixed, signals, data };
}

export function assembleBdf(parts: BdfParts): Uint8Array {
  return Uint8Array.from([...rawHeader(parts.fixed, parts.signals), ...parts.data]);
}

/** `text` as the 8 bytes of a version field (for a wrong identification byte). */
export function versionBytes(firstByte: number, rest: string): number[] {
  return [firstByte, ...field(rest, 7)];
}
