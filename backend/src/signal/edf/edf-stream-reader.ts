/**
 * EDF/EDF+ and BDF/BDF+ decoding from bytes that arrive in pieces (an upload or a file
 * stream), so the whole file never needs to be in memory: peak memory is the Float32 output
 * plus one data record. Layout from Kemp et al. 1992; TALs and EDF+C/D timing from Kemp &
 * Olivan 2003; BDF's 24-bit samples from BioSemi's BDF format and BDF+ from its description
 * (see edf-header.ts). `readEdf` uses the same code with the whole file as one piece.
 */
import {
  checkFixedHeader,
  EDF_FIXED_HEADER_BYTES,
  isPlusFormat,
  readEdfHeader,
} from './edf-header';
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
  /**
   * Buffers for the decoded signals' samples, one per length, in file order (default: new
   * Float32Arrays). Decoding overwrites every sample, so reused buffers need no clearing.
   */
  allocateSamples?: (lengths: readonly number[]) => Float32Array[];
}

const littleEndianHost = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

interface DecodedSignal {
  fileIndex: number;
  header: EdfSignalHeader;
  byteOffset: number;
  samples: Float32Array;
  gain: number;
  outOfRange: number;
}

/**
 * Decodes an EDF/EDF+ or BDF/BDF+ file (told apart by its version field) pushed in order, in pieces of any size. The header is
 * validated (`readEdfHeader`) as soon as its bytes are in, so a bad upload fails early.
 * Each method throws `EdfFormatError` on a file that breaks the specification.
 */
export class EdfStreamReader {
  private readonly fileSizeBytes: number;
  private readonly options: ReadEdfOptions;
  private received = 0;
  private headerParts: Uint8Array[] = [];
  private headerLength = 0;
  private info: EdfHeaderInfo | null = null;
  private decoded: DecodedSignal[] = [];
  private signalOffsets: number[] = [];
  private pending: Uint8Array | null = null;
  private pendingWords: Int16Array | null = null;
  private pendingBytes = 0;
  private recordIndex = 0;
  private recordStartsS = new Float64Array(0);
  private readonly annotations: EdfAnnotation[] = [];

  /** @param fileSizeBytes length of the whole file, checked against the header's sizes. */
  constructor(fileSizeBytes: number, options: ReadEdfOptions = {}) {
    this.fileSizeBytes = fileSizeBytes;
    this.options = options;
  }

  /** The validated header, once its bytes have been pushed; null before. */
  get headerInfo(): EdfHeaderInfo | null {
    return this.info;
  }

  /** Feeds the next bytes of the file (from byte 0 on, in order); keeps no reference to `chunk`. */
  push(chunk: Uint8Array): void {
    if (this.received + chunk.byteLength > this.fileSizeBytes) {
      throw new EdfFormatError(
        'file length',
        `more than ${this.fileSizeBytes} bytes`,
        `${this.fileSizeBytes} bytes, the announced size`,
      );
    }
    this.received += chunk.byteLength;
    let rest = chunk;
    if (!this.info) {
      rest = this.takeHeaderBytes(chunk);
      if (!this.info) return;
    }
    this.takeRecordBytes(rest);
  }

  /** Checks that the whole file arrived and returns the recording. */
  finish(): EdfRecording {
    const info = this.info;
    if (!info) {
      const headerBytes = this.headerParts.reduce((n, p) => n + p.byteLength, 0);
      // Let readEdfHeader name what is missing (fixed header or signal headers).
      readEdfHeader(concat(this.headerParts, headerBytes), this.received);
      throw new EdfFormatError('file length', `${this.received} bytes`, 'a complete header');
    }
    if (this.received !== this.fileSizeBytes || this.recordIndex < info.header.recordCount) {
      const missing = info.header.recordCount - this.recordIndex;
      throw new EdfFormatError(
        'data records',
        `${this.recordIndex} complete records and ${this.pendingBytes} bytes`,
        `${info.header.recordCount} records of ${info.recordBytes} bytes`,
        `file ended ${missing} records early`,
      );
    }
    const { header } = info;
    const warnings = [...info.warnings];
    const signals: EdfSignal[] = this.decoded.map((d) => {
      if (d.outOfRange > 0) {
        warnings.push(
          `Signal '${d.header.label}': ${d.outOfRange} samples outside its digital range ${d.header.digitalMin}..${d.header.digitalMax}.`,
        );
      }
      return { ...d.header, samples: d.samples };
    });
    const isPlus = isPlusFormat(header.format);
    if (isPlus) checkRecordStarts(this.recordStartsS, info);
    if (!isPlus && info.annotationSignalIndices.length > 0 && this.annotations.length === 0) {
      warnings.push('The annotation signal holds no annotations.');
    }
    return {
      header,
      signals,
      annotations: this.annotations,
      recordStartsS: this.recordStartsS,
      durationS: this.recordStartsS[this.recordStartsS.length - 1] + header.recordDurationS,
      warnings,
    };
  }

  private takeHeaderBytes(chunk: Uint8Array): Uint8Array {
    const have = this.headerParts.reduce((n, p) => n + p.byteLength, 0);
    const wanted = this.headerLength || EDF_FIXED_HEADER_BYTES;
    const take = Math.min(wanted - have, chunk.byteLength);
    // Copied (at most the header): the caller may reuse its chunk buffer after push.
    this.headerParts.push(chunk.slice(0, take));
    const rest = chunk.subarray(take);
    if (have + take < wanted) return rest;
    if (!this.headerLength) {
      const fixed = concat(this.headerParts, EDF_FIXED_HEADER_BYTES);
      this.headerLength = checkFixedHeader(fixed, this.fileSizeBytes);
      this.headerParts = [fixed];
      if (this.headerLength > EDF_FIXED_HEADER_BYTES) return this.takeHeaderBytes(rest);
    }
    this.start(readEdfHeader(concat(this.headerParts, this.headerLength), this.fileSizeBytes));
    this.headerParts = [];
    return rest;
  }

  private start(info: EdfHeaderInfo): void {
    this.info = info;
    const { header, signalHeaders, annotationSignalIndices, sampleBytes } = info;
    let offset = 0;
    for (const s of signalHeaders) {
      this.signalOffsets.push(offset);
      offset += sampleBytes * s.samplesPerRecord;
    }
    // Sizes below were checked against the file size by readEdfHeader before allocating.
    const chosen = signalHeaders.flatMap((s, i) =>
      annotationSignalIndices.includes(i) ||
      (this.options.selectSignal && !this.options.selectSignal(s, i))
        ? []
        : [i],
    );
    const lengths = chosen.map((i) => header.recordCount * signalHeaders[i].samplesPerRecord);
    const buffers = this.options.allocateSamples
      ? this.options.allocateSamples(lengths)
      : lengths.map((length) => new Float32Array(length));
    chosen.forEach((i, k) => {
      const s = signalHeaders[i];
      if (buffers[k]?.length !== lengths[k]) {
        throw new RangeError(
          `allocateSamples: expected ${lengths[k]} samples for signal ${i + 1}, got ${buffers[k]?.length}`,
        );
      }
      this.decoded.push({
        fileIndex: i,
        header: s,
        byteOffset: this.signalOffsets[i],
        samples: buffers[k],
        gain: (s.physicalMax - s.physicalMin) / (s.digitalMax - s.digitalMin),
        outOfRange: 0,
      });
    });
    this.recordStartsS = new Float64Array(header.recordCount);
    for (let r = 0; r < header.recordCount; r++) this.recordStartsS[r] = r * header.recordDurationS;
  }

  private takeRecordBytes(bytes: Uint8Array): void {
    const { recordBytes, sampleBytes } = this.info as EdfHeaderInfo;
    const sixteenBit = sampleBytes === 2;
    let pos = 0;
    if (this.pendingBytes > 0 && this.pending) {
      const take = Math.min(recordBytes - this.pendingBytes, bytes.byteLength);
      this.pending.set(bytes.subarray(0, take), this.pendingBytes);
      this.pendingBytes += take;
      pos = take;
      if (this.pendingBytes < recordBytes) return;
      this.decodeRecord(this.pending, 0, this.pendingWords);
      this.pendingBytes = 0;
    }
    // One 16-bit view of the whole piece, not one per record and signal (EDF only).
    const words = sixteenBit ? wordsOf(bytes) : null;
    while (bytes.byteLength - pos >= recordBytes) {
      this.decodeRecord(bytes, pos, words);
      pos += recordBytes;
    }
    if (pos < bytes.byteLength) {
      if (!this.pending) {
        this.pending = new Uint8Array(recordBytes);
        this.pendingWords = sixteenBit ? wordsOf(this.pending) : null;
      }
      this.pending.set(bytes.subarray(pos));
      this.pendingBytes = bytes.byteLength - pos;
    }
  }

  /**
   * Decodes the record at byte `offset` of `bytes`; `words` is null or the 16-bit view of
   * `bytes` from its first byte (`wordsOf`).
   * Physical value = (digital − dmin)·(pmax − pmin)/(dmax − dmin) + pmin (Kemp et al. 1992).
   */
  private decodeRecord(bytes: Uint8Array, offset: number, words: Int16Array | null): void {
    const info = this.info as EdfHeaderInfo;
    const r = this.recordIndex;
    if (info.sampleBytes === 3) decode24(this.decoded, bytes, offset, r);
    else this.decode16(bytes, offset, words, r);
    if (info.annotationSignalIndices.length > 0) {
      this.readRecordAnnotations(bytes.subarray(offset, offset + info.recordBytes), r, info);
    }
    this.recordIndex++;
  }

  /** The 16-bit samples of record `r` (EDF), read in place when aligned. */
  private decode16(bytes: Uint8Array, offset: number, words: Int16Array | null, r: number): void {
    for (const d of this.decoded) {
      const spr = d.header.samplesPerRecord;
      const { digitalMin: dmin, digitalMax: dmax, physicalMin: pmin } = d.header;
      const { samples, gain } = d;
      const out = r * spr;
      const start = offset + d.byteOffset;
      let outOfRange = 0;
      // 16-bit little-endian two's complement (Kemp et al. 1992): read in place when aligned.
      if (words !== null && start % 2 === 0) {
        const first = start >> 1;
        for (let k = 0; k < spr; k++) {
          const v = words[first + k];
          if (v < dmin || v > dmax) outOfRange++;
          samples[out + k] = (v - dmin) * gain + pmin;
        }
      } else {
        const view = new DataView(bytes.buffer, bytes.byteOffset + start, 2 * spr);
        for (let k = 0; k < spr; k++) {
          const v = view.getInt16(2 * k, true);
          if (v < dmin || v > dmax) outOfRange++;
          samples[out + k] = (v - dmin) * gain + pmin;
        }
      }
      d.outOfRange += outOfRange;
    }
  }

  /**
   * In EDF+ the first TAL of the first annotation signal in each record is the
   * time-keeping TAL: onset = record start, first text empty (Kemp & Olivan 2003).
   */
  private readRecordAnnotations(record: Uint8Array, r: number, info: EdfHeaderInfo): void {
    const isPlus = isPlusFormat(info.header.format);
    for (const [n, signalIndex] of info.annotationSignalIndices.entries()) {
      const start = this.signalOffsets[signalIndex];
      // An annotation signal's bytes are sampleBytes per "sample" in BDF+ too.
      const length = info.sampleBytes * info.signalHeaders[signalIndex].samplesPerRecord;
      const where = `record ${r + 1}, signal ${signalIndex + 1}`;
      const tals = parseTals(record.subarray(start, start + length), where);
      const timeKeeping = n === 0 && tals.length > 0 && tals[0].texts[0] === '' ? tals[0] : null;
      if (n === 0 && isPlus) {
        if (!timeKeeping) {
          const first = tals[0];
          throw new EdfFormatError(
            `time-keeping TAL (${where})`,
            first ? `a TAL whose first text is '${first.texts[0] ?? ''}'` : 'no TAL',
            "a first TAL '+<record start>' 0x14 0x14 (empty first text)",
          );
        }
        this.recordStartsS[r] = timeKeeping.onsetS;
      }
      for (const tal of tals) {
        const texts = tal === timeKeeping ? tal.texts.slice(1) : tal.texts;
        for (const text of texts) {
          if (text.length > 0)
            this.annotations.push({ onsetS: tal.onsetS, durationS: tal.durationS, text });
        }
      }
    }
  }
}

/**
 * The 24-bit samples of record `r` of a BDF file at byte `offset` of `bytes`: three bytes,
 * least significant first, two's complement (BioSemi BDF format), sign-extended by the
 * shift pair. Physical value as in `decodeRecord`.
 */
function decode24(decoded: DecodedSignal[], bytes: Uint8Array, offset: number, r: number): void {
  for (const d of decoded) {
    const spr = d.header.samplesPerRecord;
    const { digitalMin: dmin, digitalMax: dmax, physicalMin: pmin } = d.header;
    const { samples, gain } = d;
    const out = r * spr;
    let at = offset + d.byteOffset;
    let outOfRange = 0;
    for (let k = 0; k < spr; k++, at += 3) {
      const v = ((bytes[at] | (bytes[at + 1] << 8) | (bytes[at + 2] << 16)) << 8) >> 8;
      if (v < dmin || v > dmax) outOfRange++;
      samples[out + k] = (v - dmin) * gain + pmin;
    }
    d.outOfRange += outOfRange;
  }
}

/** The 16-bit little-endian view of `bytes` from its first byte, when it can be read in place. */
function wordsOf(bytes: Uint8Array): Int16Array | null {
  return littleEndianHost && bytes.byteOffset % 2 === 0
    ? new Int16Array(bytes.buffer, bytes.byteOffset, bytes.byteLength >> 1)
    : null;
}

function concat(parts: Uint8Array[], length: number): Uint8Array {
  if (parts.length === 1 && parts[0].byteLength === length) return parts[0];
  const out = new Uint8Array(length);
  let pos = 0;
  for (const p of parts) {
    out.set(p.subarray(0, length - pos), pos);
    pos += Math.min(p.byteLength, length - pos);
    if (pos >= length) break;
  }
  return out.subarray(0, pos);
}

/**
 * EDF+C/BDF+C records are contiguous; EDF+D/BDF+D records may have gaps but not overlap
 * (Kemp & Olivan 2003).
 */
function checkRecordStarts(recordStartsS: Float64Array, info: EdfHeaderInfo): void {
  const { recordDurationS, format } = info.header;
  // Timing differences below half the shortest sample interval move no sample.
  const fastestHz = Math.max(...info.signalHeaders.map((s) => s.sampleRateHz));
  const toleranceS = 0.5 / fastestHz;
  for (let r = 1; r < recordStartsS.length; r++) {
    const start = recordStartsS[r];
    const contiguous = recordStartsS[0] + r * recordDurationS;
    if (format.endsWith('+C') && Math.abs(start - contiguous) > toleranceS) {
      throw new EdfFormatError(
        `time-keeping TAL (record ${r + 1})`,
        `start ${start} s`,
        `${contiguous} s, as ${format} records are contiguous`,
      );
    }
    const previousEnd = recordStartsS[r - 1] + recordDurationS;
    if (format.endsWith('+D') && start < previousEnd - toleranceS) {
      throw new EdfFormatError(
        `time-keeping TAL (record ${r + 1})`,
        `start ${start} s`,
        `at least ${previousEnd} s (the end of record ${r}); records may not overlap`,
      );
    }
  }
}
