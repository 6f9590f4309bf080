/**
 * Buffers for `argsortFloat64`; sized for the largest input seen, reused across calls
 * of one owner (never shared between concurrent calls).
 */
export class ArgsortWorkspace {
  private capacity = 0;
  keyLo = new Uint32Array(0);
  keyHi = new Uint32Array(0);
  index = new Int32Array(0);
  keyLo2 = new Uint32Array(0);
  keyHi2 = new Uint32Array(0);
  index2 = new Int32Array(0);
  readonly counts = new Int32Array(65536);

  ensure(n: number): void {
    if (n <= this.capacity) return;
    this.capacity = n;
    this.keyLo = new Uint32Array(n);
    this.keyHi = new Uint32Array(n);
    this.index = new Int32Array(n);
    this.keyLo2 = new Uint32Array(n);
    this.keyHi2 = new Uint32Array(n);
    this.index2 = new Int32Array(n);
  }
}

/**
 * Sort order of `values` (ascending, NaN last): writes into `order` the indices such
 * that values[order[0]] ≤ values[order[1]] ≤ …, stable for equal values.
 *
 * LSD radix sort on the IEEE-754 bit pattern, made monotone by flipping all bits of
 * negative numbers and the sign bit of the others (common practice); 16-bit digits,
 * four passes at most, and a pass is skipped when all keys share that digit.
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
  workspace.ensure(n);
  const bits = new Uint32Array(values.buffer, values.byteOffset, 2 * n);
  let lo = workspace.keyLo;
  let hi = workspace.keyHi;
  let idx = workspace.index;
  let lo2 = workspace.keyLo2;
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
  for (let pass = 0; pass < 4; pass++) {
    const useHi = pass >= 2;
    const shift = pass % 2 === 0 ? 0 : 16;
    const src = useHi ? hi : lo;
    counts.fill(0);
    for (let i = 0; i < n; i++) counts[(src[i] >>> shift) & 0xffff]++;
    if (counts[(src[0] >>> shift) & 0xffff] === n) continue;
    let sum = 0;
    for (let d = 0; d < 65536; d++) {
      const c = counts[d];
      counts[d] = sum;
      sum += c;
    }
    for (let i = 0; i < n; i++) {
      const d = (src[i] >>> shift) & 0xffff;
      const p = counts[d]++;
      lo2[p] = lo[i];
      hi2[p] = hi[i];
      idx2[p] = idx[i];
    }
    let t32 = lo;
    lo = lo2;
    lo2 = t32;
    t32 = hi;
    hi = hi2;
    hi2 = t32;
    const ti = idx;
    idx = idx2;
    idx2 = ti;
  }
  order.set(idx.subarray(0, n));
}
