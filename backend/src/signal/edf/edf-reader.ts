/**
 * EDF/EDF+ reader (Kemp et al. 1992; Kemp & Olivan 2003).
 *
 * Why not edfdecoder 0.1.2: it needs a real ArrayBuffer (a Node Buffer gives null),
 * returns null on a bad file instead of saying what is wrong, knows nothing of EDF+
 * (annotations come back as numbers, no EDF+D record times), parses the start date
 * wrongly (two-digit year not expanded, month off by one), and copies every record
 * into arrays of its own before converting, so a 230 MB file costs several times its
 * size. This reader validates the whole header first (`readEdfHeader`), checks every
 * size against the real byte length before allocating, reads the 16-bit samples in
 * place, and allocates only the output Float32Arrays. edfdecoder is still used in the
 * tests, as an independent decoder of plain EDF.
 */
import { EDF_FIXED_HEADER_BYTES, readEdfHeader, requiredHeaderBytes } from './edf-header';
import { EdfFormatError } from './edf-format-error';
import { parseTals } from './edf-tal';
import type {
  EdfAnnotation,
  EdfHeaderInfo,
  EdfRecording,
  EdfSignal,
  EdfSignalHeader,
} from './edf.types';

export interface ReadEdfOptions {
  /**
   * Decode only the ordinary signals for which this returns true (index counts every
   * signal of the file, annotation signals included). Others are left out of
   * `signals`, which saves their memory (e.g. decode the region of interest only).
   */
  selectSignal?: (signal: EdfSignalHeader, fileIndex: number) => boolean;
}

const littleEndianHost = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * Reads an EDF or EDF+ (C or D) file held in memory. Throws `EdfFormatError` naming
 * the field, the value found and the value expected when the file breaks the
 * specification. Does not copy `bytes`; the result holds no reference to it.
 *
 * Physical value = (digital − dmin) · (pmax − pmin) / (dmax − dmin) + pmin
 * (Kemp et al. 1992), kept in the signal's own `physicalDimension` (see `toMicrovolts`).
 */
export function readEdf(bytes: Uint8Array, options: ReadEdfOptions = {}): EdfRecording {
  const headerLength = requiredHeaderBytes(bytes.subarray(0, EDF_FIXED_HEADER_BYTES));
  const info = readEdfHeader(bytes.subarray(0, headerLength), bytes.byteLength);
  const { header, signalHeaders, annotationSignalIndices } = info;
  const warnings = [...info.warnings];

  // Byte offset of each signal inside a data record.
  const signalOffsets: number[] = [];
  let offset = 0;
  for (const s of signalHeaders) {
    signalOffsets.push(offset);
    offset += 2 * s.samplesPerRecord;
  }

  const signals: EdfSignal[] = [];
  signalHeaders.forEach((s, i) => {
    if (annotationSignalIndices.includes(i)) return;
    if (options.selectSignal && !options.selectSignal(s, i)) return;
    const { samples, outOfRange } = decodeSignal(bytes, info, signalOffsets[i], s);
    if (outOfRange > 0) {
      warnings.push(
        `Signal '${s.label}': ${outOfRange} samples outside its digital range ${s.digitalMin}..${s.digitalMax}.`,
      );
    }
    signals.push({ ...s, samples });
  });

  const { annotations, recordStartsS } = readAnnotations(bytes, info, signalOffsets, warnings);
  const lastStart = recordStartsS[recordStartsS.length - 1];
  return {
    header,
    signals,
    annotations,
    recordStartsS,
    durationS: lastStart + header.recordDurationS,
    warnings,
  };
}

function decodeSignal(
  bytes: Uint8Array,
  info: EdfHeaderInfo,
  signalOffset: number,
  s: EdfSignalHeader,
): { samples: Float32Array; outOfRange: number } {
  const { header, recordBytes } = info;
  const spr = s.samplesPerRecord;
  // Size already checked against the byte length in readEdfHeader.
  const samples = new Float32Array(header.recordCount * spr);
  const dmin = s.digitalMin;
  const dmax = s.digitalMax;
  const pmin = s.physicalMin;
  const gain = (s.physicalMax - pmin) / (dmax - dmin);
  let outOfRange = 0;
  const start = bytes.byteOffset + header.headerBytes + signalOffset;
  // Little-endian 16-bit two's complement (Kemp et al. 1992): read in place when aligned.
  const inPlace = littleEndianHost && start % 2 === 0;
  const words = inPlace
    ? new Int16Array(bytes.buffer, bytes.byteOffset, Math.floor(bytes.byteLength / 2))
    : null;
  const view = inPlace ? null : new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  for (let r = 0; r < header.recordCount; r++) {
    const recordStart = header.headerBytes + r * recordBytes + signalOffset;
    const out = r * spr;
    if (words) {
      const w0 = recordStart / 2;
      for (let k = 0; k < spr; k++) {
        const d = words[w0 + k];
        if (d < dmin || d > dmax) outOfRange++;
        samples[out + k] = (d - dmin) * gain + pmin;
      }
    } else if (view) {
      for (let k = 0; k < spr; k++) {
        const d = view.getInt16(recordStart + 2 * k, true);
        if (d < dmin || d > dmax) outOfRange++;
        samples[out + k] = (d - dmin) * gain + pmin;
      }
    }
  }
  return { samples, outOfRange };
}

/**
 * Annotations of every `EDF Annotations` signal and the start of each data record.
 * In EDF+ the first TAL of the first annotation signal in each record must be the
 * time-keeping TAL (onset = record start, first text empty; Kemp & Olivan 2003); EDF+C
 * records must follow each other without gaps, EDF+D records may have gaps but must
 * not go back in time or overlap.
 */
function readAnnotations(
  bytes: Uint8Array,
  info: EdfHeaderInfo,
  signalOffsets: number[],
  warnings: string[],
): { annotations: EdfAnnotation[]; recordStartsS: Float64Array } {
  const { header, signalHeaders, annotationSignalIndices, recordBytes } = info;
  const { recordCount, recordDurationS, format } = header;
  const recordStartsS = new Float64Array(recordCount);
  for (let r = 0; r < recordCount; r++) recordStartsS[r] = r * recordDurationS;
  const annotations: EdfAnnotation[] = [];
  const isEdfPlus = format !== 'EDF';

  for (let r = 0; r < recordCount; r++) {
    for (const [n, signalIndex] of annotationSignalIndices.entries()) {
      const start = header.headerBytes + r * recordBytes + signalOffsets[signalIndex];
      const length = 2 * signalHeaders[signalIndex].samplesPerRecord;
      const where = `record ${r + 1}, signal ${signalIndex + 1}`;
      const tals = parseTals(bytes.subarray(start, start + length), where);
      const timeKeeping = n === 0 && tals.length > 0 && tals[0].texts[0] === '' ? tals[0] : null;
      if (n === 0 && isEdfPlus) {
        if (!timeKeeping) {
          const first = tals[0];
          throw new EdfFormatError(
            `time-keeping TAL (${where})`,
            first ? `a TAL whose first text is '${first.texts[0] ?? ''}'` : 'no TAL',
            "a first TAL '+<record start>' 0x14 0x14 (empty first text)",
          );
        }
        recordStartsS[r] = timeKeeping.onsetS;
      }
      for (const tal of tals) {
        const texts = tal === timeKeeping ? tal.texts.slice(1) : tal.texts;
        for (const text of texts) {
          if (text.length === 0) continue;
          annotations.push({ onsetS: tal.onsetS, durationS: tal.durationS, text });
        }
      }
    }
  }
  if (isEdfPlus) checkRecordStarts(recordStartsS, info);
  if (!isEdfPlus && annotationSignalIndices.length > 0 && annotations.length === 0) {
    warnings.push('The annotation signal holds no annotations.');
  }
  return { annotations, recordStartsS };
}

function checkRecordStarts(recordStartsS: Float64Array, info: EdfHeaderInfo): void {
  const { recordDurationS, format } = info.header;
  // Timing errors below half the shortest sample interval move no sample.
  const fastestHz = Math.max(...info.signalHeaders.map((s) => s.sampleRateHz));
  const toleranceS = 0.5 / fastestHz;
  for (let r = 1; r < recordStartsS.length; r++) {
    const previousEnd = recordStartsS[r - 1] + recordDurationS;
    const start = recordStartsS[r];
    if (
      format === 'EDF+C' &&
      Math.abs(start - (recordStartsS[0] + r * recordDurationS)) > toleranceS
    ) {
      throw new EdfFormatError(
        `time-keeping TAL (record ${r + 1})`,
        `start ${start} s`,
        `${recordStartsS[0] + r * recordDurationS} s, as EDF+C records are contiguous`,
      );
    }
    if (format === 'EDF+D' && start < previousEnd - toleranceS) {
      throw new EdfFormatError(
        `time-keeping TAL (record ${r + 1})`,
        `start ${start} s`,
        `at least ${previousEnd} s (the end of record ${r}); records may not overlap`,
      );
    }
  }
}
