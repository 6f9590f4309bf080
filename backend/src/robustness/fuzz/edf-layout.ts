/**
 * Where things are in a valid EDF/EDF+ file, so mutations can aim at boundaries and fields
 * rather than only at random bytes. Read here from the field layout of Kemp et al. 1992 and
 * the TAL rules of Kemp & Olivan 2003, deliberately without the reader under test: the
 * fuzzer must not share the reader's idea of the format.
 */
import { signalField } from '../../signal/edf/testing/edf-field-layout';

export interface EdfLayout {
  signalCount: number;
  headerBytes: number;
  recordCount: number;
  recordBytes: number;
  samplesPerRecord: number[];
  /** Byte offset of each signal inside a data record. */
  signalOffsets: number[];
  /** Indices of the `EDF Annotations` signals. */
  annotationSignals: number[];
}

function text(bytes: Uint8Array, offset: number, width: number): string {
  let out = '';
  for (let i = offset; i < offset + width; i++) out += String.fromCharCode(bytes[i]);
  return out.trim();
}

/** The layout of a valid file (the fuzzer's own base files only). */
export function layoutOf(bytes: Uint8Array): EdfLayout {
  const signalCount = Number(text(bytes, 252, 4));
  const headerBytes = 256 * (1 + signalCount);
  const recordCount = Number(text(bytes, 236, 8));
  const samplesPerRecord: number[] = [];
  const annotationSignals: number[] = [];
  for (let i = 0; i < signalCount; i++) {
    const spr = signalField('samplesPerRecord', i, signalCount);
    samplesPerRecord.push(Number(text(bytes, spr.offset, spr.width)));
    const label = signalField('label', i, signalCount);
    if (text(bytes, label.offset, label.width) === 'EDF Annotations') annotationSignals.push(i);
  }
  const signalOffsets: number[] = [];
  let at = 0;
  for (const spr of samplesPerRecord) {
    signalOffsets.push(at);
    at += 2 * spr;
  }
  return {
    signalCount,
    headerBytes,
    recordCount,
    recordBytes: at,
    samplesPerRecord,
    signalOffsets,
    annotationSignals,
  };
}

/** Byte range of signal `signal`'s part of record `record`. */
export function signalBytesIn(
  layout: EdfLayout,
  record: number,
  signal: number,
): { start: number; end: number } {
  const start = layout.headerBytes + record * layout.recordBytes + layout.signalOffsets[signal];
  return { start, end: start + 2 * layout.samplesPerRecord[signal] };
}
