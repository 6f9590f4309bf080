import { ArgsortWorkspace, argsortFloat64 } from './radix-argsort';

/**
 * Buffers of the running median; grows to the largest request and is reused across
 * window lengths and channels of one caller. Never share one between concurrent calls.
 */
export class RunningMedianWorkspace {
  readonly argsort = new ArgsortWorkspace();
  padded = new Float64Array(0);
  order = new Int32Array(0);
  rank = new Int32Array(0);
  nodeRank = new Int32Array(0);
  next = new Int32Array(0);
  prev = new Int32Array(0);
  last = new Int32Array(0);
  private chunks: Float64Array[] = [];

  ensurePadded(n: number): void {
    if (this.padded.length >= n) return;
    this.padded = new Float64Array(n);
    this.order = new Int32Array(n);
    this.rank = new Int32Array(n);
  }

  /** `count` series of `length` values, reused from call to call. */
  chunkOutputs(count: number, length: number): Float64Array[] {
    if (this.chunks.length !== count || this.chunks[0].length !== length) {
      this.chunks = Array.from({ length: count }, () => new Float64Array(length));
    }
    return this.chunks;
  }

  ensureNodes(nodes: number, blocks: number): void {
    if (this.next.length < nodes) {
      this.nodeRank = new Int32Array(nodes);
      this.next = new Int32Array(nodes);
      this.prev = new Int32Array(nodes);
    }
    if (this.last.length < blocks) this.last = new Int32Array(blocks);
  }
}

/** Index into [0, n) of position i after mirroring about the edges ("reflect": d c b a | a b c d). */
function reflectIndex(i: number, n: number): number {
  const period = 2 * n;
  let j = i % period;
  if (j < 0) j += period;
  return j < n ? j : period - 1 - j;
}

const RANK_HEAD = -1;
const RANK_TAIL = 0x7fffffff;

/**
 * Outputs per chunk (default): the chunk with its margins, ranks and linked lists then
 * take about 1 MB, so a whole pass stays in a core's L2 cache.
 */
export const DEFAULT_MEDIAN_CHUNK_SAMPLES = 16384;

/**
 * Outputs [start, start + length) of the input mirrored about its edges, with
 * `maxHalfWidth` neighbours on both sides, ranked once. Every window length up to
 * 2·maxHalfWidth + 1 then reads a sub-range of the same ranking, so sorting the blocks
 * of each window length costs one linear pass instead of a sort. A window only sees
 * its own neighbours, so a chunk's medians equal those of the whole series: chunks
 * keep the working set small without changing a value.
 */
class RankedInput {
  constructor(
    readonly length: number,
    readonly maxHalfWidth: number,
    readonly ws: RunningMedianWorkspace,
  ) {}
}

function rankInput(
  input: Float64Array,
  start: number,
  length: number,
  maxHalfWidth: number,
  ws: RunningMedianWorkspace,
): RankedInput {
  const n = input.length;
  const total = length + 2 * maxHalfWidth;
  ws.ensurePadded(total);
  const padded = ws.padded.subarray(0, total);
  const from = start - maxHalfWidth;
  if (from >= 0 && from + total <= n) {
    padded.set(input.subarray(from, from + total));
  } else {
    for (let i = 0; i < total; i++) padded[i] = input[reflectIndex(from + i, n)];
  }
  const order = ws.order;
  argsortFloat64(padded, order, ws.argsort);
  const rank = ws.rank;
  for (let r = 0; r < total; r++) rank[order[r]] = r;
  return new RankedInput(length, maxHalfWidth, ws);
}

/**
 * Running median of one odd window length over ranked input (Suomela 2014, "Median
 * filtering is equivalent to sorting", arXiv:1406.1717): the padded input is cut into
 * blocks of k samples, each block kept as a sorted doubly linked list; a window
 * starting inside block b is the tail of block b plus the head of block b+1, so
 * sliding by one sample deletes one node from the first list and restores one node in
 * the second ("dancing links"). One cursor per list marks its first element above the
 * median; with exactly h = (k−1)/2 elements before the two cursors, the median is the
 * smaller cursor, and each slide moves a cursor by at most two steps; with the ranking shared by all
 * window lengths the whole pass is O(N) after one O(N log N) sort.
 */
function medianOfWindow(ranked: RankedInput, windowSamples: number, output: Float64Array): void {
  const n = ranked.length;
  const k = windowSamples;
  const h = (k - 1) >> 1;
  const ws = ranked.ws;
  const offset = ranked.maxHalfWidth - h;
  const span = n + 2 * h;
  const blocks = Math.ceil(span / k);
  const elements = blocks * k;
  const nodes = elements + 2 * blocks;
  ws.ensureNodes(nodes, blocks);
  const { nodeRank, next, prev, last, rank, order } = ws;
  const total = n + 2 * ranked.maxHalfWidth;

  for (let q = 0; q < span; q++) nodeRank[q] = rank[offset + q];
  // Positions past the data get ranks above every real one (they never reach a window).
  for (let q = span; q < elements; q++) nodeRank[q] = total + (q - span);
  for (let b = 0; b < blocks; b++) {
    const head = elements + 2 * b;
    nodeRank[head] = RANK_HEAD;
    nodeRank[head + 1] = RANK_TAIL;
    last[b] = head;
  }
  // Sorted lists of every block in one pass over the global order.
  for (let r = 0; r < total; r++) {
    const q = order[r] - offset;
    if (q < 0 || q >= span) continue;
    const b = (q / k) | 0;
    const tail = last[b];
    next[tail] = q;
    prev[q] = tail;
    last[b] = q;
  }
  for (let q = span; q < elements; q++) {
    const b = blocks - 1;
    const tail = last[b];
    next[tail] = q;
    prev[q] = tail;
    last[b] = q;
  }
  for (let b = 0; b < blocks; b++) {
    const tail = elements + 2 * b + 1;
    next[last[b]] = tail;
    prev[tail] = last[b];
  }

  const padded = ws.padded;
  for (let b = 0; b * k < n; b++) {
    const startA = b * k;
    // Median of the full block b: the (h+1)-th node of its list.
    let mA = next[elements + 2 * b];
    for (let j = 0; j < h; j++) mA = next[mA];
    let rmA = nodeRank[mA];
    output[startA] = padded[offset + mA];
    if (startA + 1 >= n) break;
    // Empty block b+1 by unlinking from its last position down to its first.
    const startB = startA + k;
    for (let q = startB + k - 1; q >= startB; q--) {
      next[prev[q]] = next[q];
      prev[next[q]] = prev[q];
    }
    let mB = elements + 2 * (b + 1) + 1;
    let rmB = RANK_TAIL;
    let i = 1;
    for (; i < k; i++) {
      const s = startA + i;
      if (s >= n) break;
      // Slide: drop node a from list A, restore node x in list B. The cursors' ranks
      // are kept in rmA/rmB so that each step reads few arrays.
      const a = s - 1;
      const ra = nodeRank[a];
      const aSmall = ra < rmA;
      const na = next[a];
      const pa = prev[a];
      if (a === mA) {
        mA = na;
        rmA = nodeRank[na];
      }
      next[pa] = na;
      prev[na] = pa;
      const x = startB + i - 1;
      next[prev[x]] = x;
      prev[next[x]] = x;
      const rx = nodeRank[x];
      const xSmall = rx < rmB;
      if (aSmall) {
        if (xSmall) {
          // Still h small elements, but x may exceed A's smallest large element.
          if (rx > rmA) {
            mB = x;
            rmB = rx;
            mA = next[mA];
            rmA = nodeRank[mA];
          }
        } else if (rmA < rmB) {
          mA = next[mA];
          rmA = nodeRank[mA];
        } else {
          mB = next[mB];
          rmB = nodeRank[mB];
        }
      } else if (xSmall) {
        const p1 = prev[mA];
        const p2 = prev[mB];
        const r1 = nodeRank[p1];
        const r2 = nodeRank[p2];
        if (r1 > r2) {
          mA = p1;
          rmA = r1;
        } else {
          mB = p2;
          rmB = r2;
        }
      }
      // The median node lies in blocks b or b+1: read its value near the others.
      output[s] = padded[offset + (rmA < rmB ? mA : mB)];
    }
    // Restore the rest of block b+1 so that it is complete as the next block A.
    for (let q = startB + i - 1; q < startB + k; q++) {
      next[prev[q]] = q;
      prev[next[q]] = q;
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
 * `scipy.ndimage.median_filter(mode='reflect')` does (d c b a | a b c d).
 */
export function runningMedian(
  input: Float64Array,
  options: { windowSamples: number; chunkSamples?: number },
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
    { windowsSamples: [options.windowSamples], chunkSamples: options.chunkSamples },
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
  options: { windowsSamples: readonly number[]; chunkSamples?: number },
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
  options: { windowsSamples: readonly number[]; chunkSamples?: number },
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
    const ranked = rankInput(input, start, length, maxHalfWidth, workspace);
    const medians =
      length === buffers[0].length ? buffers : buffers.map((b) => b.subarray(0, length));
    windows.forEach((w, i) => medianOfWindow(ranked, w, medians[i]));
    take(start, medians);
  }
}
