import { seededUniform } from '../random/random';
import { BootstrapOptions, quantileSorted } from './onset-statistics';
import { BOOTSTRAP_RESAMPLES, BOOTSTRAP_SEED } from '../pipeline/analysis-settings';

/**
 * Percentile bootstrap interval of mean(first) − mean(second) for two independent samples
 * (Efron & Tibshirani 1993, "An Introduction to the Bootstrap", ch. 13 and §8.3): each
 * resample draws n₁ values of `first` and n₂ of `second` with replacement, each group on its
 * own (as `scipy.stats.bootstrap` does with `paired=False`); the interval's ends are the
 * (1−level)/2 and (1+level)/2 quantiles of the sorted differences (numpy's linear rule).
 * Null when either sample is empty.
 */
export function bootstrapMeanDifferenceInterval(
  first: ArrayLike<number>,
  second: ArrayLike<number>,
  options: BootstrapOptions = {},
): [number, number] | null {
  if (first.length === 0 || second.length === 0) return null;
  const resamples = options.resamples ?? BOOTSTRAP_RESAMPLES;
  const level = options.level ?? 0.95;
  const random = seededUniform(options.seed ?? BOOTSTRAP_SEED);
  const resampledMean = (values: ArrayLike<number>): number => {
    let sum = 0;
    for (let i = 0; i < values.length; i++) {
      sum += values[Math.floor(random() * values.length)];
    }
    return sum / values.length;
  };
  const differences = new Float64Array(resamples);
  for (let r = 0; r < resamples; r++) {
    differences[r] = resampledMean(first) - resampledMean(second);
  }
  differences.sort();
  return [
    quantileSorted(differences, (1 - level) / 2),
    quantileSorted(differences, (1 + level) / 2),
  ];
}
