import { open } from 'node:fs/promises';
import { EdfStreamReader, type ReadEdfOptions } from '../edf/edf-stream-reader';
import type { EdfHeaderInfo, EdfRecording, EdfSignalHeader } from '../edf/edf.types';

const littleEndianHost = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * Bytes read from disk at a time: even, so a 16-bit EDF sample never straddles two chunks (a
 * 24-bit BDF sample may: the range counter carries its first bytes over).
 */
export const DEFAULT_EDF_CHUNK_BYTES = 1 << 20;

export interface ReadEdfFileOptions {
  /**
   * Decode only the ordinary signals for which this returns true, as `ReadEdfOptions`
   * (index counts every signal of the file); `ordinarySignals` lists all non-annotation
   * signal headers, for a choice that depends on the others.
   */
  selectSignal?: (
    signal: EdfSignalHeader,
    fileIndex: number,
    ordinarySignals: readonly EdfSignalHeader[],
  ) => boolean;
  /** Bytes per read (even, default 1 MiB). */
  chunkBytes?: number;
  /** Receives every chunk of the file in order, even after a format error (e.g. to hash it). */
  onChunk?: (chunk: Uint8Array) => void;
  /**
   * Also count the digital values out of range of the signals left out, so the warnings are
   * those of reading every signal (default true). A reader that reads one file several
   * times needs them only once: counting walks every sample of the file.
   */
  warnAboutLeftOut?: boolean;
  /** Buffers for the decoded samples, as `ReadEdfOptions.allocateSamples` (e.g. a `SampleArena`). */
  allocateSamples?: ReadEdfOptions['allocateSamples'];
}

/**
 * Sample buffers that one reader after another reuses: each `allocate` hands out views of
 * one block, grown to the largest request seen, so reading a file in several batches of
 * channels touches the same memory again instead of fresh pages (a page fault per 4 KiB on
 * first touch). What one `allocate` handed out is valid until the next.
 */
export class SampleArena {
  private block = new Float32Array(0);

  readonly allocate = (lengths: readonly number[]): Float32Array[] => {
    const total = lengths.reduce((sum, length) => sum + length, 0);
    if (this.block.length < total) this.block = new Float32Array(total);
    let offset = 0;
    return lengths.map((length) => {
      const view = this.block.subarray(offset, offset + length);
      offset += length;
      return view;
    });
  };
}

/** A file read to its end; `finish()` gives the recording or throws the reader's error. */
export interface EdfFileRead {
  /** Every ordinary (non-annotation) signal header in file order, decoded or not; null without a header. */
  ordinarySignals: EdfSignalHeader[] | null;
  finish(): EdfRecording;
}

/**
 * Reads an EDF/EDF+ or BDF/BDF+ file from disk in chunks through `EdfStreamReader`, so the file's
 * bytes are never held whole: with `selectSignal` only the chosen signals' samples are
 * kept. The result is the one `readEdf(whole file, options)` gives, errors included
 * (a format error is kept and rethrown by `finish()`, after the whole file was read and
 * passed to `onChunk`), and its warnings are those of reading every signal: digital
 * values outside their range are counted here for the signals left out.
 * Errors of the file system (missing file, no permission) are thrown at once.
 */
export async function readEdfFile(
  path: string,
  options: ReadEdfFileOptions = {},
): Promise<EdfFileRead> {
  const chunkBytes = options.chunkBytes ?? DEFAULT_EDF_CHUNK_BYTES;
  if (!Number.isInteger(chunkBytes) || chunkBytes < 2 || chunkBytes % 2 !== 0) {
    throw new RangeError(`chunkBytes: expected an even integer ≥ 2, got ${chunkBytes}`);
  }
  const handle = await open(path, 'r');
  try {
    const { size } = await handle.stat();
    const choose = options.selectSignal;
    let ordinary: EdfSignalHeader[] | null = null;
    const selectSignal: ReadEdfOptions['selectSignal'] = choose
      ? (signal, index) => {
          // Called once per signal, once the header is validated.
          ordinary ??= ordinarySignalsOf(reader.headerInfo as EdfHeaderInfo);
          return choose(signal, index, ordinary);
        }
      : undefined;
    const reader: EdfStreamReader = new EdfStreamReader(size, {
      selectSignal,
      allocateSamples: options.allocateSamples,
    });
    const buffer = new Uint8Array(chunkBytes);
    let counter: RangeCounter | null = null;
    let failure: { error: unknown } | null = null;
    let position = 0;
    for (;;) {
      const { bytesRead } = await handle.read(buffer, 0, chunkBytes, position);
      if (bytesRead === 0) break;
      const chunk = buffer.subarray(0, bytesRead);
      options.onChunk?.(chunk);
      if (failure === null) {
        try {
          reader.push(chunk);
          const info = reader.headerInfo;
          if (info && counter === null && options.warnAboutLeftOut !== false) {
            counter = RangeCounter.forLeftOut(info, selectSignal);
          }
          counter?.count(chunk, position);
        } catch (error) {
          failure = { error };
        }
      }
      position += bytesRead;
    }
    const info = reader.headerInfo;
    const ordinarySignals = info ? ordinarySignalsOf(info) : null;
    const caught = failure;
    return {
      ordinarySignals,
      finish(): EdfRecording {
        if (caught !== null) throw caught.error;
        const recording = reader.finish();
        if (counter !== null && info !== null) counter.mergeWarnings(recording, info);
        return recording;
      },
    };
  } finally {
    await handle.close();
  }
}

function ordinarySignalsOf(info: EdfHeaderInfo): EdfSignalHeader[] {
  return info.signalHeaders.filter((_, i) => !info.annotationSignalIndices.includes(i));
}

/**
 * Digital values outside [digitalMin, digitalMax] per ordinary signal, counted from the
 * raw 16-bit (EDF, Kemp et al. 1992) or 24-bit (BDF, BioSemi BDF format) little-endian
 * samples when some signals are not decoded, so that the warnings name them as reading
 * every signal would. A "word" is one sample of the record, 2 or 3 bytes.
 */
class RangeCounter {
  private readonly signalOfWord: Int32Array;
  /** The first bytes of a 24-bit sample the previous chunk ended in, least significant first. */
  private carried = 0;
  /** Word index (in a record) where the signal of each word's run ends. */
  private readonly runEnd: Int32Array;
  private readonly counts: number[];
  private readonly digitalMin: Int32Array;
  private readonly digitalMax: Int32Array;

  private constructor(
    private readonly info: EdfHeaderInfo,
    private readonly selected: boolean[],
  ) {
    this.counts = info.signalHeaders.map(() => 0);
    this.digitalMin = Int32Array.from(info.signalHeaders, (s) => s.digitalMin);
    this.digitalMax = Int32Array.from(info.signalHeaders, (s) => s.digitalMax);
    this.signalOfWord = new Int32Array(info.recordBytes / info.sampleBytes);
    this.runEnd = new Int32Array(info.recordBytes / info.sampleBytes);
    let word = 0;
    info.signalHeaders.forEach((s, i) => {
      const ordinary = !info.annotationSignalIndices.includes(i);
      this.signalOfWord.fill(ordinary ? i : -1, word, word + s.samplesPerRecord);
      this.runEnd.fill(word + s.samplesPerRecord, word, word + s.samplesPerRecord);
      word += s.samplesPerRecord;
    });
  }

  /** A counter when some ordinary signal is left out by `selectSignal`, else null. */
  static forLeftOut(
    info: EdfHeaderInfo,
    select: ReadEdfOptions['selectSignal'],
  ): RangeCounter | null {
    const selected = info.signalHeaders.map(
      (s, i) => !info.annotationSignalIndices.includes(i) && (!select || select(s, i)),
    );
    const leftOut = info.signalHeaders.some(
      (_, i) => !info.annotationSignalIndices.includes(i) && !selected[i],
    );
    return leftOut ? new RangeCounter(info, selected) : null;
  }

  /** Counts every signal's values in `chunk`, which starts at byte `position` of the file. */
  count(chunk: Uint8Array, position: number): void {
    const headerBytes = this.info.header.headerBytes;
    const dataBytes = this.info.recordBytes * this.info.header.recordCount;
    const from = Math.max(position, headerBytes);
    const to = Math.min(position + chunk.byteLength, headerBytes + dataBytes);
    if (to <= from) return;
    if (this.info.sampleBytes === 3) {
      this.count24(chunk, from - position, to - position, from - headerBytes);
      return;
    }
    const start = chunk.byteOffset + from - position;
    const whole = (from - headerBytes) % 2 === 0 && (to - from) % 2 === 0;
    if (littleEndianHost && whole && start % 2 === 0) {
      this.countWords(new Int16Array(chunk.buffer, start, (to - from) / 2), from - headerBytes);
      return;
    }
    const words = this.signalOfWord;
    const recordWords = words.length;
    const { counts, digitalMin, digitalMax } = this;
    let w = ((from - headerBytes) / 2) % recordWords;
    for (let at = from - position; at < to - position; at += 2) {
      const s = words[w];
      if (s >= 0) {
        const v = ((chunk[at] | (chunk[at + 1] << 8)) << 16) >> 16;
        if (v < digitalMin[s] || v > digitalMax[s]) counts[s]++;
      }
      w = w + 1 === recordWords ? 0 : w + 1;
    }
  }

  /**
   * The count over 24-bit samples (BDF) in `chunk[at, end)`, whose first byte is byte
   * `dataOffset` of the data records; a sample cut by the chunk's end is finished by the next.
   */
  private count24(chunk: Uint8Array, at: number, end: number, dataOffset: number): void {
    const words = this.signalOfWord;
    const recordWords = words.length;
    const { counts, digitalMin, digitalMax } = this;
    const check = (w: number, v: number): void => {
      const s = words[w];
      if (s >= 0 && (v < digitalMin[s] || v > digitalMax[s])) counts[s]++;
    };
    let w = Math.floor(dataOffset / 3) % recordWords;
    let part = dataOffset % 3;
    if (part > 0) {
      let v = this.carried;
      for (; part < 3 && at < end; part++) v |= chunk[at++] << (8 * part);
      if (part < 3) {
        this.carried = v;
        return;
      }
      check(w, (v << 8) >> 8);
      w = w + 1 === recordWords ? 0 : w + 1;
    }
    for (; at + 3 <= end; at += 3) {
      check(w, ((chunk[at] | (chunk[at + 1] << 8) | (chunk[at + 2] << 16)) << 8) >> 8);
      w = w + 1 === recordWords ? 0 : w + 1;
    }
    this.carried = 0;
    for (let k = 0; at < end; k++) this.carried |= chunk[at++] << (8 * k);
  }

  /**
   * The same count over 16-bit samples read in place (little-endian host, aligned), one
   * signal's contiguous run of a record at a time: `dataOffset` is the first word's byte
   * offset in the data records.
   */
  private countWords(samples: Int16Array, dataOffset: number): void {
    const words = this.signalOfWord;
    const runEnd = this.runEnd;
    const recordWords = words.length;
    const { counts, digitalMin, digitalMax } = this;
    let w = (dataOffset / 2) % recordWords;
    for (let k = 0; k < samples.length;) {
      const take = Math.min(runEnd[w] - w, samples.length - k);
      const s = words[w];
      if (s >= 0) {
        const lo = digitalMin[s];
        const hi = digitalMax[s];
        let outside = 0;
        for (let i = k; i < k + take; i++) {
          const v = samples[i];
          if (v < lo || v > hi) outside++;
        }
        counts[s] += outside;
      }
      k += take;
      w += take;
      if (w === recordWords) w = 0;
    }
  }

  /**
   * The reader's warnings list its range warnings for decoded signals right after the
   * header's warnings; put the warnings of every signal there, in file order.
   */
  mergeWarnings(recording: EdfRecording, info: EdfHeaderInfo): void {
    const decodedWarned = this.counts.filter((c, i) => c > 0 && this.selected[i]).length;
    const all = info.signalHeaders.flatMap((s, i) =>
      this.counts[i] > 0
        ? [
            `Signal '${s.label}': ${this.counts[i]} samples outside its digital range ${s.digitalMin}..${s.digitalMax}.`,
          ]
        : [],
    );
    recording.warnings.splice(info.warnings.length, decodedWarned, ...all);
  }
}
