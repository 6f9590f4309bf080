// Hand-written: the running median needs a stable order of Float64Array keys with ranks and
// sorted values in typed arrays, and no well-known package sorts typed keys without boxing them.

/** Widest digit: the counters of one pass (2^11) stay in L1 cache. */
const MAX_DIGIT_BITS = 11;
/** A 32-bit word needs at most three passes of 11 bits. */
const MAX_PASSES = 3;
/** Runs of equal high words longer than this are sorted by comparison, not by insertion. */
const INSERTION_RUN = 32;
/** The key of every NaN: above +Infinity (0xFFF00000 00000000), so NaN sorts last. */
const NAN_KEY = 0xffffffff;

/**
 * Buffers for `argsortFloat64` and `rankFloat64`; sized for the largest input seen,
 * reused across calls of one owner (never shared between concurrent calls).
 */
export class ArgsortWorkspace {
  private capacity = 0;
  keyLo = new Uint32Array(0);
  keyHi = new Uint32Array(0);
  index = new Int32Array(0);
  keyHi2 = new Uint32Array(0);
  index2 = new Int32Array(0);
  readonly counts = new Int32Array(MAX_PASSES << MAX_DIGIT_BITS);

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
 * The stable ascending order of `values` (NaN last), as indices in one of the
 * workspace's buffers (valid until its next use).
 *
 * The IEEE-754 bit pattern is made monotone by flipping all bits of negative numbers
 * and the sign bit of the others (common practice); every NaN gets the largest key.
 * An LSD radix sort orders the high 32-bit words over the bits that differ between
 * them only (one sign and exponent are shared by most measured series), in as few
 * passes of at most 11 bits as those bits need; runs of equal high words, which are
 * short for measured data, are then ordered by their low words.
 */
function sortedIndices(values: Float64Array, workspace: ArgsortWorkspace): Int32Array {
  const n = values.length;
  workspace.ensure(n);
  const bits = new Uint32Array(values.buffer, values.byteOffset, 2 * n);
  const lo = workspace.keyLo;
  let hi = workspace.keyHi;
  let idx = workspace.index;
  let hi2 = workspace.keyHi2;
  let idx2 = workspace.index2;
  let anyBits = 0;
  let allBits = -1;
  // Little-endian platforms (every Node target): low word first.
  for (let i = 0; i < n; i++) {
    let l = bits[2 * i];
    let h = bits[2 * i + 1];
    if ((h & 0x7ff00000) === 0x7ff00000 && values[i] !== values[i]) {
      l = NAN_KEY;
      h = NAN_KEY;
    } else if (h & 0x80000000) {
      l = ~l;
      h = ~h;
    } else {
      h |= 0x80000000;
    }
    lo[i] = l;
    hi[i] = h;
    anyBits |= h;
    allBits &= h;
  }
  const width = 32 - Math.clz32(anyBits ^ allBits);
  const passes = Math.ceil(width / MAX_DIGIT_BITS);
  if (passes === 0) {
    for (let i = 0; i < n; i++) idx[i] = i;
  } else {
    const digit = Math.ceil(width / passes);
    const size = 1 << digit;
    const mask = size - 1;
    const counts = workspace.counts;
    counts.fill(0, 0, passes * size);
    for (let i = 0; i < n; i++) {
      const h = hi[i];
      counts[h & mask]++;
      if (passes > 1) counts[size + ((h >>> digit) & mask)]++;
      if (passes > 2) counts[2 * size + ((h >>> (2 * digit)) & mask)]++;
    }
    for (let pass = 0; pass < passes; pass++) {
      const base = pass * size;
      const shift = pass * digit;
      let sum = 0;
      for (let d = base; d < base + size; d++) {
        const c = counts[d];
        counts[d] = sum;
        sum += c;
      }
      if (pass === 0) {
        // The first pass reads the identity order without a buffer.
        for (let i = 0; i < n; i++) {
          const h = hi[i];
          const p = counts[base + (h & mask)]++;
          hi2[p] = h;
          idx2[p] = i;
        }
      } else {
        for (let i = 0; i < n; i++) {
          const h = hi[i];
          const p = counts[base + ((h >>> shift) & mask)]++;
          hi2[p] = h;
          idx2[p] = idx[i];
        }
      }
      const th = hi;
      hi = hi2;
      hi2 = th;
      const ti = idx;
      idx = idx2;
      idx2 = ti;
    }
  }
  // `lo` is still indexed by input position: runs of equal high words by low word.
  let start = 0;
  for (let i = 1; i <= n; i++) {
    if (i < n && hi[i] === hi[start]) continue;
    if (i - start > 1) sortRunByLowWord(idx, lo, start, i);
    start = i;
  }
  return idx;
}

/** Orders idx[start, end) by low word, stably (equal values keep their input order). */
function sortRunByLowWord(idx: Int32Array, lo: Uint32Array, start: number, end: number): void {
  let ordered = true;
  for (let i = start + 1; i < end && ordered; i++) ordered = lo[idx[i - 1]] <= lo[idx[i]];
  // Plateaus of equal values come out of the stable radix passes already in order.
  if (ordered) return;
  if (end - start > INSERTION_RUN) {
    const run = Array.from(idx.subarray(start, end));
    run.sort((a, b) => lo[a] - lo[b] || a - b);
    idx.set(run, start);
    return;
  }
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

/**
 * Sort order of `values` (ascending, NaN last): writes into `order` the indices such
 * that values[order[0]] ≤ values[order[1]] ≤ …, stable for equal values.
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
  order.set(sortedIndices(values, workspace).subarray(0, n));
}

/**
 * Ranks of `values` in the order of `argsortFloat64`: rank[i] is the position of
 * values[i] (ties by position, NaN last), and sorted[r] the value of rank r.
 */
export function rankFloat64(
  values: Float64Array,
  rank: Int32Array,
  sorted: Float64Array,
  workspace: ArgsortWorkspace,
): void {
  const n = values.length;
  if (rank.length < n || sorted.length < n) {
    throw new RangeError(
      `rank, sorted: expected length ≥ ${n}, got ${rank.length} and ${sorted.length}`,
    );
  }
  if (n === 0) return;
  const order = sortedIndices(values, workspace);
  for (let r = 0; r < n; r++) {
    const i = order[r];
    rank[i] = r;
    sorted[r] = values[i];
  }
}
