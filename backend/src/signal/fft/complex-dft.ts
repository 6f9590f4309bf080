/**
 * Work buffers of one plan, owned by the caller: create them once per call site with the
 * plan's `createScratch()` and never share them between threads. A plan uses as many as
 * it needs (zero-length buffers when it needs none).
 */
export interface DftScratch {
  a: Float64Array;
  b: Float64Array;
}

/** A forward complex DFT X[k] = Σ x[n]·e^(−2πikn/N) of one length N. */
export interface ComplexDft {
  readonly size: number;
  createScratch(): DftScratch;
  /** Interleaved `[re0, im0, re1, im1, …]` input and output of length 2·N (distinct buffers). */
  forward(input: Float64Array, output: Float64Array, scratch: DftScratch): void;
}

/** Throws unless `buffer` has the expected length (a wrong buffer would give silently wrong bins). */
export function checkLength(buffer: Float64Array, expected: number, name: string): void {
  if (buffer.length !== expected) {
    throw new RangeError(`FFT ${name}: expected length ${expected}, got ${buffer.length}`);
  }
}
