// Hand-written: no well-known package gives running medians of several window lengths from
// one shared ranking, value for value as scipy.ndimage.median_filter(mode='reflect').
import { ArgsortWorkspace, rankFloat64 } from './radix-argsort';

/**
 * Buffers of the running median; grows to the largest request and is reused across
 * window lengths and channels of one caller. Never share one between concurrent calls.
 */
export class RunningMedianWorkspace {
  readonly argsort = new ArgsortWorkspace();
  /** The chunk with its margins, mirrored at the ends of the input. */
  padded = new Float64Array(0);
  /** rank[i]: position of padded[i] in ascending order (ties by position). */
  rank = new Int32Array(0);
  /** sorted[r]: the value of rank r. */
  sorted = new Float64Array(0);
  /** The ranks inside the window as a bit set: rank r is bit r of words[r >>> 5]. */
  words = new Int32Array(0);
  private chunks: Float64Array[] = [];

  ensure(total: number): void {
    if (this.padded.length >= total) return;
    this.padded = new Float64Array(total);
    this.rank = new Int32Array(total);
    this.sorted = new Float64Array(total);
    this.words = new Int32Array((total + 31) >>> 5);
  }

  /** `count` series of `length` values, reused from call to call. */
  chunkOutputs(count: number, length: number): Float64Array[] {
    if (this.chunks.length !== count || this.chunks[0].length !== length) {
      this.chunks = Array.from({ length: count }, () => new Float64Array(length));
    }
    return this.chunks;
  }
}

/** Index into [0, n) of position i after mirroring about the edges ("reflect": d c b a | a b c d). */
function reflectIndex(i: number, n: number): number {
  const period = 2 * n;
  let j = i % period;
  if (j < 0) j += period;
  return j < n ? j : period - 1 - j;
}

/**
 * Outputs per chunk (default). On one 60-min channel at 500 Hz with the ten default
 * windows, 1024 to 4096 ran alike and 16384 about 25 % slower: a smaller chunk keeps
 * the bit set short (fewer words to scan between ranks) and everything in L1/L2 cache,
 * while the margins (2 × 100 samples here) are ranked again by every chunk.
 */
export const DEFAULT_MEDIAN_CHUNK_SAMPLES = 2048;

/**
 * Outputs [start, start + length) of the input mirrored about its edges, with
 * `maxHalfWidth` neighbours on both sides, ranked once. Every window length up to
 * 2·maxHalfWidth + 1 then reads a sub-range of the same ranking. A window only sees
 * its own neighbours, so a chunk's medians equal those of the whole series: chunks
 * keep the working set small without changing a value.
 */
interface RankedChunk {
  length: number;
  maxHalfWidth: number;
  ws: RunningMedianWorkspace;
}

function rankChunk(
  input: Float64Array,
  start: number,
  length: number,
  maxHalfWidth: number,
  ws: RunningMedianWorkspace,
): RankedChunk {
  const n = input.length;
  const total = length + 2 * maxHalfWidth;
  ws.ensure(total);
  const padded = ws.padded.subarray(0, total);
  const from = start - maxHalfWidth;
  if (from >= 0 && from + total <= n) {
    padded.set(input.subarray(from, from + total));
  } else {
    for (let i = 0; i < total; i++) padded[i] = input[reflectIndex(from + i, n)];
  }
  rankFloat64(padded, ws.rank, ws.sorted, ws.argsort);
  return { length, maxHalfWidth, ws };
}

/** Lowest bit set in x (x ≠ 0), 0…31. */
function lowestBit(x: number): number {
  return 31 - Math.clz32(x & -x);
}

/** Highest bit set in x (x ≠ 0), 0…31. */
function highestBit(x: number): number {
  return 31 - Math.clz32(x);
}

/** Smallest rank in the set above `r` (r may be −1); one must exist. */
function rankAbove(words: Int32Array, r: number): number {
  const s = r + 1;
  let w = s >>> 5;
  // `-1 << s` keeps bits s & 31 … 31 (JavaScript shifts by the count mod 32).
  let bits = words[w] & (-1 << s);
  while (bits === 0) bits = words[++w];
  return (w << 5) | lowestBit(bits);
}

/** Largest rank in the set below `r`; one must exist. */
function rankBelow(words: Int32Array, r: number): number {
  let w = r >>> 5;
  // `~(-1 << r)` keeps bits 0 … (r & 31) − 1.
  let bits = words[w] & ~(-1 << r);
  while (bits === 0) bits = words[--w];
  return (w << 5) | highestBit(bits);
}

/**
 * Running median of one odd window length k = 2h + 1 over a ranked chunk. The ranks
 * inside the window are a set of bits, one bit per rank of the chunk. The median is
 * the rank with exactly h ranks of the window below it; sliding by one sample clears
 * one bit and sets another, which moves the median by at most one place in the
 * window's order: to the next rank above when a rank at or below it left and a larger
 * one came in, to the next below in the mirror case, found by scanning words of 32
 * ranks (a few words in a chunk of a few thousand ranks; at most the chunk's ranks / 32).
 * Ranks give a total order consistent with the values, ties included, so
 * sorted[median rank] is the value a sorting of every window would give. Unlike
 * linked lists of sorted blocks, nothing is built per window length: one sort per
 * chunk serves all of them.
 */
function medianOfWindow(chunk: RankedChunk, windowSamples: number, output: Float64Array): void {
  const n = chunk.length;
  const h = (windowSamples - 1) >> 1;
  const { rank, sorted, words } = chunk.ws;
  const total = n + 2 * chunk.maxHalfWidth;
  // Window of output i: padded[first + i … first + i + 2h].
  const first = chunk.maxHalfWidth - h;
  words.fill(0, 0, (total + 31) >>> 5);
  for (let q = first; q <= first + 2 * h; q++) {
    const r = rank[q];
    words[r >>> 5] |= 1 << r;
  }
  let m = -1;
  for (let j = 0; j <= h; j++) m = rankAbove(words, m);
  output[0] = sorted[m];
  for (let i = 1; i < n; i++) {
    const out = rank[first + i - 1];
    const into = rank[first + i + 2 * h];
    words[out >>> 5] &= ~(1 << out);
    words[into >>> 5] |= 1 << into;
    if (into < m) {
      if (out >= m) m = rankBelow(words, m);
    } else if (out <= m) {
      m = rankAbove(words, m);
    }
    output[i] = sorted[m];
  }
}

/** Smallest rank in the set above `r`, or −1 when there is none below `end` (exclusive). */
function rankAboveOrNone(words: Int32Array, r: number, end: number): number {
  const s = r + 1;
  if (s >= end) return -1;
  let w = s >>> 5;
  const lastWord = (end - 1) >>> 5;
  let bits = words[w] & (-1 << s);
  while (bits === 0) {
    if (++w > lastWord) return -1;
    bits = words[w];
  }
  const found = (w << 5) | lowestBit(bits);
  return found < end ? found : -1;
}

/**
 * `medianOfWindow` that leaves NaN out (as `numpy.nanmedian` over each window): with v
 * numbers in the window the median is the rank with ⌊(v−1)/2⌋ numbers of the window below
 * it, or for even v the mean of it and the next. NaN ranks above every number, so the
 * numbers of a window are its lowest ranks; a window of NaN only gives NaN. The tracked
 * rank moves by the change in its target, a few places per sample. Used only when the
 * amplitude gate is on: the plain path above stays as fast as it was.
 */
function nanMedianOfWindow(chunk: RankedChunk, windowSamples: number, output: Float64Array): void {
  const n = chunk.length;
  const h = (windowSamples - 1) >> 1;
  const { rank, sorted, words } = chunk.ws;
  const total = n + 2 * chunk.maxHalfWidth;
  const first = chunk.maxHalfWidth - h;
  // NaN ranks last: ranks from `firstNaN` on are NaN, so a rank says whether it is a number.
  let firstNaN = total;
  while (firstNaN > 0 && Number.isNaN(sorted[firstNaN - 1])) firstNaN--;
  words.fill(0, 0, (total + 31) >>> 5);
  let numbers = 0;
  for (let q = first; q <= first + 2 * h; q++) {
    const r = rank[q];
    words[r >>> 5] |= 1 << r;
    if (r < firstNaN) numbers++;
  }
  // m: a rank in the window; below: ranks of the window under m.
  let m = rankAboveOrNone(words, -1, total);
  let below = 0;
  for (let i = 0; ; i++) {
    if (numbers > 0) {
      const target = (numbers - 1) >> 1;
      while (below < target) {
        m = rankAbove(words, m);
        below++;
      }
      while (below > target) {
        m = rankBelow(words, m);
        below--;
      }
      output[i] = numbers % 2 === 1 ? sorted[m] : (sorted[m] + sorted[rankAbove(words, m)]) / 2;
    } else {
      output[i] = NaN;
    }
    if (i + 1 >= n) break;
    const out = rank[first + i];
    const into = rank[first + i + 2 * h + 1];
    if (out < firstNaN) numbers--;
    if (into < firstNaN) numbers++;
    words[into >>> 5] |= 1 << into;
    if (into < m) below++;
    words[out >>> 5] &= ~(1 << out);
    if (out < m) {
      below--;
    } else if (out === m) {
      const above = rankAboveOrNone(words, m, total);
      if (above >= 0) {
        m = above;
      } else {
        m = rankBelow(words, m);
        below--;
      }
    }
  }
}

function checkWindow(windowSamples: number): void {
  if (!Number.isInteger(windowSamples) || windowSamples < 1 || windowSamples % 2 === 0) {
    throw new RangeError(`windowSamples: expected an odd positive integer, got ${windowSamples}`);
  }
}

/**
 * Running median with an odd window of `windowSamples`, centred, edges mirrored as
 * `scipy.ndimage.median_filter(mode='reflect')` does (d c b a | a b c d). NaN counts
 * as larger than every number (as numpy.sort orders it); with `skipNaN` it is left out of
 * each window instead (as `numpy.nanmedian`), and a window of NaN only gives NaN.
 */
export function runningMedian(
  input: Float64Array,
  options: { windowSamples: number; chunkSamples?: number; skipNaN?: boolean },
  workspace: RunningMedianWorkspace = new RunningMedianWorkspace(),
  output: Float64Array = new Float64Array(input.length),
): Float64Array {
  checkWindow(options.windowSamples);
  if (input.length === 0) return output;
  if (output.length !== input.length) {
    throw new RangeError(`output: expected length ${input.length}, got ${output.length}`);
  }
  runningMedians(
    input,
    {
      windowsSamples: [options.windowSamples],
      chunkSamples: options.chunkSamples,
      skipNaN: options.skipNaN,
    },
    workspace,
    [output],
  );
  return output;
}

/**
 * Running medians of several odd window lengths over the same input; one ranking per
 * chunk of `chunkSamples` outputs serves all of them. `outputs[i]` receives the median
 * for `windowsSamples[i]`.
 */
export function runningMedians(
  input: Float64Array,
  options: { windowsSamples: readonly number[]; chunkSamples?: number; skipNaN?: boolean },
  workspace: RunningMedianWorkspace,
  outputs: Float64Array[],
): void {
  const windows = options.windowsSamples;
  if (outputs.length !== windows.length) {
    throw new RangeError(`outputs: expected ${windows.length} arrays, got ${outputs.length}`);
  }
  outputs.forEach((out, i) => {
    if (out.length !== input.length) {
      throw new RangeError(`outputs[${i}]: expected length ${input.length}, got ${out.length}`);
    }
  });
  runningMedianChunks(input, options, workspace, (start, medians) => {
    medians.forEach((m, i) => outputs[i].set(m, start));
  });
}

/**
 * The running medians of `runningMedians`, chunk by chunk: `take(start, medians)`
 * receives, for the outputs [start, start + medians[0].length), one series per window
 * length. The series are the workspace's buffers, valid only during the call, so a
 * caller that reduces them at once (e.g. the median across windows) never holds
 * full-length series per window.
 */
export function runningMedianChunks(
  input: Float64Array,
  options: { windowsSamples: readonly number[]; chunkSamples?: number; skipNaN?: boolean },
  workspace: RunningMedianWorkspace,
  take: (start: number, medians: readonly Float64Array[]) => void,
): void {
  const windows = options.windowsSamples;
  windows.forEach(checkWindow);
  const chunk = options.chunkSamples ?? DEFAULT_MEDIAN_CHUNK_SAMPLES;
  if (!Number.isInteger(chunk) || chunk < 1) {
    throw new RangeError(`chunkSamples: expected a positive integer, got ${chunk}`);
  }
  const n = input.length;
  if (n === 0 || windows.length === 0) return;
  const maxHalfWidth = (Math.max(...windows) - 1) >> 1;
  const buffers = workspace.chunkOutputs(windows.length, Math.min(chunk, n));
  for (let start = 0; start < n; start += chunk) {
    const length = Math.min(n, start + chunk) - start;
    const ranked = rankChunk(input, start, length, maxHalfWidth, workspace);
    const medians =
      length === buffers[0].length ? buffers : buffers.map((b) => b.subarray(0, length));
    const median = options.skipNaN ? nanMedianOfWindow : medianOfWindow;
    windows.forEach((w, i) => median(ranked, w, medians[i]));
    take(start, medians);
  }
}
