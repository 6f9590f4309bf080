/** 11-bit digits: three passes cover a 32-bit word, and the 2048 counters stay in L1 cache. */
const DIGIT_BITS = 11;
const DIGIT_VALUES = 1 << DIGIT_BITS;
/** Runs of equal high words longer than this are sorted by comparison, not by insertion. */
const INSERTION_RUN = 32;

/**
 * Buffers for `argsortFloat64`; sized for the largest input seen, reused across calls
 * of one owner (never shared between concurrent calls).
 */
export class ArgsortWorkspace {
  private capacity = 0;
  keyLo = new Uint32Array(0);
  keyHi = new Uint32Array(0);
  index = new Int32Array(0);
  keyHi2 = new Uint32Array(0);
  index2 = new Int32Array(0);
  readonly counts = new Int32Array(DIGIT_VALUES);

  ensure(n: number): void {
    if (n <= this.capacity) return;
    this.capacity = n;
    this.keyLo = new Uint32Array(n);
    this.keyHi = new Uint32Array(n);
    this.index = new Int32Array(n);
    this.keyHi2 = new Uint32Array(n);
    this.index2 = new Int32Array(n);
  }
}

/**
 * Sort order of `values` (ascending, NaN last): writes into `order` the indices such
 * that values[order[0]] ≤ values[order[1]] ≤ …, stable for equal values.
 *
 * The IEEE-754 bit pattern is made monotone by flipping all bits of negative numbers
 * and the sign bit of the others (common practice). An LSD radix sort (11-bit digits,
 * a pass skipped when all keys share that digit) orders the high 32-bit words; runs
 * of equal high words, which are short for measured data, are then ordered by their
 * low words by insertion (a comparison sort for long runs).
 */
export function argsortFloat64(
  values: Float64Array,
  order: Int32Array,
  workspace: ArgsortWorkspace,
): void {
  const n = values.length;
  if (order.length < n) {
    throw new RangeError(`order: expected length ≥ ${n}, got ${order.length}`);
  }
  if (n === 0) return;
  workspace.ensure(n);
  const bits = new Uint32Array(values.buffer, values.byteOffset, 2 * n);
  const lo = workspace.keyLo;
  let hi = workspace.keyHi;
  let idx = workspace.index;
  let hi2 = workspace.keyHi2;
  let idx2 = workspace.index2;
  // Little-endian platforms (every Node target): low word first.
  for (let i = 0; i < n; i++) {
    const l = bits[2 * i];
    const h = bits[2 * i + 1];
    if (h & 0x80000000) {
      lo[i] = ~l >>> 0;
      hi[i] = ~h >>> 0;
    } else {
      lo[i] = l;
      hi[i] = (h | 0x80000000) >>> 0;
    }
    idx[i] = i;
  }
  const counts = workspace.counts;
  const mask = DIGIT_VALUES - 1;
  for (let shift = 0; shift < 32; shift += DIGIT_BITS) {
    counts.fill(0);
    for (let i = 0; i < n; i++) counts[(hi[i] >>> shift) & mask]++;
    if (counts[(hi[0] >>> shift) & mask] === n) continue;
    let sum = 0;
    for (let d = 0; d < DIGIT_VALUES; d++) {
      const c = counts[d];
      counts[d] = sum;
      sum += c;
    }
    for (let i = 0; i < n; i++) {
      const h = hi[i];
      const p = counts[(h >>> shift) & mask]++;
      hi2[p] = h;
      idx2[p] = idx[i];
    }
    const th = hi;
    hi = hi2;
    hi2 = th;
    const ti = idx;
    idx = idx2;
    idx2 = ti;
  }
  // `lo` is still indexed by input position: runs of equal high words by low word.
  let start = 0;
  while (start < n) {
    const h = hi[start];
    let end = start + 1;
    while (end < n && hi[end] === h) end++;
    if (end - start > INSERTION_RUN) {
      const run = Array.from(idx.subarray(start, end));
      run.sort((a, b) => lo[a] - lo[b] || a - b);
      idx.set(run, start);
    } else {
      for (let i = start + 1; i < end; i++) {
        const moving = idx[i];
        const key = lo[moving];
        let j = i - 1;
        while (j >= start && lo[idx[j]] > key) {
          idx[j + 1] = idx[j];
          j--;
        }
        idx[j + 1] = moving;
      }
    }
    start = end;
  }
  order.set(idx.subarray(0, n));
}
