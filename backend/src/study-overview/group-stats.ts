import tQuantile from '@stdlib/stats-base-dists-t-quantile';

export interface MeanInterval {
  n: number;
  mean: number | null;
  /** Sample standard deviation (n − 1 in the denominator); null below two values. */
  sd: number | null;
  ciLow: number | null;
  ciHigh: number | null;
}

/**
 * Mean and the two-sided 95 % confidence interval of the mean: mean ± t₀.₉₇₅,ₙ₋₁ · s/√n
 * (Student t interval, docs/method.md §5). No interval below two values.
 */
export function meanWithInterval(values: readonly number[], level = 0.95): MeanInterval {
  const n = values.length;
  if (n === 0) return { n, mean: null, sd: null, ciLow: null, ciHigh: null };
  const mean = values.reduce((a, v) => a + v, 0) / n;
  if (n < 2) return { n, mean, sd: null, ciLow: null, ciHigh: null };
  const sd = Math.sqrt(values.reduce((a, v) => a + (v - mean) ** 2, 0) / (n - 1));
  const half = (tQuantile((1 + level) / 2, n - 1) * sd) / Math.sqrt(n);
  return { n, mean, sd, ciLow: mean - half, ciHigh: mean + half };
}
