/**
 * Median across series at each sample: the value between the two middle ones for an
 * even count (as `numpy.median` does, the mean of the two middle values).
 * Ten series (the default number of median windows, Cohen 2014) use a fixed
 * 29-comparator sorting network for ten inputs (a known optimal network, from
 * memory; the test checks that it sorts all 2^10 zero-one inputs).
 */
export function medianAcross(series: readonly Float64Array[], output: Float64Array): Float64Array {
  const count = series.length;
  if (count === 0) throw new RangeError('series: expected at least one series, got none');
  const n = output.length;
  for (let s = 0; s < count; s++) {
    if (series[s].length !== n) {
      throw new RangeError(`series[${s}]: expected length ${n}, got ${series[s].length}`);
    }
  }
  if (count === 10) {
    medianOfTen(series, output);
    return output;
  }
  const scratch = new Float64Array(count);
  const mid = count >> 1;
  for (let i = 0; i < n; i++) {
    for (let s = 0; s < count; s++) scratch[s] = series[s][i];
    scratch.sort();
    output[i] = count % 2 === 1 ? scratch[mid] : (scratch[mid - 1] + scratch[mid]) / 2;
  }
  return output;
}

/** The comparators of the ten-input network, as index pairs (lower, upper). */
export const TEN_INPUT_NETWORK: readonly (readonly [number, number])[] = [
  [4, 9],
  [3, 8],
  [2, 7],
  [1, 6],
  [0, 5],
  [1, 4],
  [6, 9],
  [0, 3],
  [5, 8],
  [0, 2],
  [3, 6],
  [7, 9],
  [0, 1],
  [2, 4],
  [5, 7],
  [8, 9],
  [1, 2],
  [4, 6],
  [7, 8],
  [3, 5],
  [2, 5],
  [6, 8],
  [1, 3],
  [4, 7],
  [2, 3],
  [6, 7],
  [3, 4],
  [5, 6],
  [4, 5],
];

function medianOfTen(series: readonly Float64Array[], output: Float64Array): void {
  const [s0, s1, s2, s3, s4, s5, s6, s7, s8, s9] = series;
  const n = output.length;
  for (let i = 0; i < n; i++) {
    let v0 = s0[i],
      v1 = s1[i],
      v2 = s2[i],
      v3 = s3[i],
      v4 = s4[i];
    let v5 = s5[i],
      v6 = s6[i],
      v7 = s7[i],
      v8 = s8[i],
      v9 = s9[i];
    let t: number;
    // TEN_INPUT_NETWORK unrolled; where only one output of a comparator is read later
    // (only elements 4 and 5 are needed), just that side is written.
    if (v4 > v9) {
      t = v4;
      v4 = v9;
      v9 = t;
    }
    if (v3 > v8) {
      t = v3;
      v3 = v8;
      v8 = t;
    }
    if (v2 > v7) {
      t = v2;
      v2 = v7;
      v7 = t;
    }
    if (v1 > v6) {
      t = v1;
      v1 = v6;
      v6 = t;
    }
    if (v0 > v5) {
      t = v0;
      v0 = v5;
      v5 = t;
    }
    if (v1 > v4) {
      t = v1;
      v1 = v4;
      v4 = t;
    }
    if (v6 > v9) {
      t = v6;
      v6 = v9;
      v9 = t;
    }
    if (v0 > v3) {
      t = v0;
      v0 = v3;
      v3 = t;
    }
    if (v5 > v8) {
      t = v5;
      v5 = v8;
      v8 = t;
    }
    if (v0 > v2) {
      t = v0;
      v0 = v2;
      v2 = t;
    }
    if (v3 > v6) {
      t = v3;
      v3 = v6;
      v6 = t;
    }
    if (v7 > v9) {
      t = v7;
      v7 = v9;
      v9 = t;
    }
    if (v0 > v1) v1 = v0;
    if (v2 > v4) {
      t = v2;
      v2 = v4;
      v4 = t;
    }
    if (v5 > v7) {
      t = v5;
      v5 = v7;
      v7 = t;
    }
    if (v9 < v8) v8 = v9;
    if (v1 > v2) {
      t = v1;
      v1 = v2;
      v2 = t;
    }
    if (v4 > v6) {
      t = v4;
      v4 = v6;
      v6 = t;
    }
    if (v7 > v8) {
      t = v7;
      v7 = v8;
      v8 = t;
    }
    if (v3 > v5) {
      t = v3;
      v3 = v5;
      v5 = t;
    }
    if (v2 > v5) {
      t = v2;
      v2 = v5;
      v5 = t;
    }
    if (v8 < v6) v6 = v8;
    if (v1 > v3) v3 = v1;
    if (v4 > v7) {
      t = v4;
      v4 = v7;
      v7 = t;
    }
    if (v2 > v3) v3 = v2;
    if (v7 < v6) v6 = v7;
    if (v3 > v4) v4 = v3;
    if (v6 < v5) v5 = v6;
    if (v4 > v5) {
      t = v4;
      v4 = v5;
      v5 = t;
    }
    output[i] = (v4 + v5) / 2;
  }
}
