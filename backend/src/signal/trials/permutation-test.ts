/**
 * Two-sample permutation test of the difference of means (docs/method.md, "Conditions").
 * Hand-written: no installed package runs a seeded permutation test, and the counting
 * rules below must be scipy's to the count.
 */
import { seededUniform } from '../random/random';

export interface PermutationTestOptions {
  /** Random splits when the distinct splits outnumber them (default 5000). */
  resamples?: number;
  /** Seed of the random splits (`seededUniform`). */
  seed: number;
}

export interface PermutationTestResult {
  /** mean(first) − mean(second). */
  statistic: number;
  /** Two-sided p. */
  pValue: number;
  /** True when every distinct split was enumerated (the p is exact). */
  exact: boolean;
  /** Splits the null distribution holds: all distinct ones, or the random ones. */
  resamples: number;
}

/**
 * Two-sided permutation test of mean(first) − mean(second), the two groups' values
 * exchanged under the null hypothesis (Ernst 2004, "Permutation methods: a basis for exact
 * inference", Statist. Sci. 19:676–685), counted as `scipy.stats.permutation_test` does with
 * `permutation_type='independent'` (scipy docs): when the distinct splits C(n, n₁) are no more
 * than `resamples`, all of them (the observed one included), p = 2·min(#{T ≤ t}, #{T ≥ t}) / C;
 * otherwise `resamples` random splits, p = 2·min(#{T ≤ t} + 1, #{T ≥ t} + 1) / (resamples + 1);
 * capped at 1. Values within 100 machine epsilons (relative to |t|) of t count as equal.
 */
export function meanDifferencePermutationTest(
  first: ArrayLike<number>,
  second: ArrayLike<number>,
  options: PermutationTestOptions,
): PermutationTestResult {
  const n1 = first.length;
  const n2 = second.length;
  if (n1 === 0 || n2 === 0) {
    throw new RangeError(`samples: expected values in both, got ${n1} and ${n2}`);
  }
  const pooled = Float64Array.from([...Array.from(first), ...Array.from(second)]);
  if (pooled.some((v) => !Number.isFinite(v))) {
    throw new RangeError('samples: expected finite numbers, found NaN or infinity');
  }
  const n = n1 + n2;
  let total = 0;
  for (const v of pooled) total += v;
  const statisticOf = (sumFirst: number): number => sumFirst / n1 - (total - sumFirst) / n2;
  let observedSum = 0;
  for (let i = 0; i < n1; i++) observedSum += pooled[i];
  const observed = statisticOf(observedSum);
  const gamma = Math.abs(observed) * 100 * Number.EPSILON;
  let less = 0;
  let greater = 0;
  const count = (sumFirst: number): void => {
    const t = statisticOf(sumFirst);
    if (t <= observed + gamma) less++;
    if (t >= observed - gamma) greater++;
  };
  const resamples = options.resamples ?? 5000;
  const splits = binomial(n, Math.min(n1, n2));
  if (splits <= resamples) {
    forEachSubsetSum(pooled, n1, count);
    return {
      statistic: observed,
      pValue: Math.min(1, (2 * Math.min(less, greater)) / splits),
      exact: true,
      resamples: splits,
    };
  }
  const random = seededUniform(options.seed);
  const order = Float64Array.from(pooled);
  for (let r = 0; r < resamples; r++) {
    // A uniformly random n1-subset: the first n1 places of a partial Fisher–Yates shuffle.
    let sum = 0;
    for (let i = 0; i < n1; i++) {
      const j = i + Math.floor(random() * (n - i));
      const v = order[j];
      order[j] = order[i];
      order[i] = v;
      sum += v;
    }
    count(sum);
  }
  return {
    statistic: observed,
    pValue: Math.min(1, (2 * Math.min(less + 1, greater + 1)) / (resamples + 1)),
    exact: false,
    resamples,
  };
}

/** C(n, k) as a float (exact while below 2^53; only compared with a resample count). */
function binomial(n: number, k: number): number {
  let c = 1;
  for (let i = 1; i <= k; i++) c = (c * (n - k + i)) / i;
  return Math.round(c);
}

/** Calls `visit` with the sum of every k-subset of `values`, in lexicographic order of indices. */
function forEachSubsetSum(values: Float64Array, k: number, visit: (sum: number) => void): void {
  const n = values.length;
  const index = Int32Array.from({ length: k }, (_, i) => i);
  for (;;) {
    let sum = 0;
    for (let i = 0; i < k; i++) sum += values[index[i]];
    visit(sum);
    let i = k - 1;
    while (i >= 0 && index[i] === n - k + i) i--;
    if (i < 0) return;
    index[i]++;
    for (let j = i + 1; j < k; j++) index[j] = index[j - 1] + 1;
  }
}
