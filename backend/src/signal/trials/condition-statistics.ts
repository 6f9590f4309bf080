/**
 * Conditions: the onset labels of a task recording (docs/method.md, "Conditions"). Which
 * trials belong to which condition, which two are compared, and the statistics of their
 * difference: a bootstrap interval over trials within each condition (Efron & Tibshirani
 * 1993) and a permutation test of the difference of means (Ernst 2004).
 */
import type {
  CONDITION_PERMUTATION_SEED as SharedPermutationSeed,
  CONDITION_PERMUTATIONS as SharedPermutations,
  ConditionDifferenceView,
  ConditionPairSource,
} from '@gyre/shared';
import { BOOTSTRAP_RESAMPLES, BOOTSTRAP_SEED } from '../pipeline/analysis-settings';
import { meanDifferencePermutationTest } from './permutation-test';
import { bootstrapMeanDifferenceInterval } from './two-sample-bootstrap';

/** Permutations of the difference test and their fixed seed (typed as the API's constants). */
export const CONDITION_PERMUTATIONS: typeof SharedPermutations = 5000;
export const CONDITION_PERMUTATION_SEED: typeof SharedPermutationSeed = 20190815;

/** The trials of one condition. */
export interface ConditionGroup {
  /** The label as first seen. */
  label: string;
  /** Indices of the onsets with this label (in the order given). */
  trials: number[];
}

/** The key two labels share when they name the same condition (as the onset-label filter). */
export const conditionKey = (label: string): string => label.trim().toLowerCase();

/**
 * The conditions of a list of onset labels: labels that match case-insensitively (ends
 * trimmed) are one condition under the first spelling seen, in order of first appearance.
 * Empty labels belong to no condition.
 */
export function groupConditions(labels: readonly string[]): ConditionGroup[] {
  const byKey = new Map<string, ConditionGroup>();
  labels.forEach((label, trial) => {
    const key = conditionKey(label);
    if (key === '') return;
    const group = byKey.get(key);
    if (group) group.trials.push(trial);
    else byKey.set(key, { label: label.trim(), trials: [trial] });
  });
  return [...byKey.values()];
}

export type ConditionPairChoice =
  { pair: [string, string]; chosenBy: ConditionPairSource } | { pair: null; unknown: string[] };

/**
 * The two conditions a difference compares, as found labels: `requested` (chosen by
 * 'request') over `fromSettings` ('settings'), else the first two found ('first-two');
 * `{ pair: null, unknown: [] }` with fewer than two conditions, and the names nothing matches
 * in `unknown` when a named pair does not match.
 */
export function chooseConditionPair(
  found: readonly string[],
  fromSettings: readonly [string, string] | null,
  requested: readonly [string, string] | null = null,
): ConditionPairChoice {
  const named = requested ?? fromSettings;
  if (named === null) {
    return found.length >= 2
      ? { pair: [found[0], found[1]], chosenBy: 'first-two' }
      : { pair: null, unknown: [] };
  }
  const match = named.map((name) => found.find((f) => conditionKey(f) === conditionKey(name)));
  const unknown = named.filter((_, i) => match[i] === undefined);
  if (unknown.length > 0 || match[0] === undefined || match[1] === undefined) {
    return { pair: null, unknown };
  }
  return { pair: [match[0], match[1]], chosenBy: requested !== null ? 'request' : 'settings' };
}

/**
 * Δf(first) − Δf(second) from each condition's trial Δf values, with the percentile
 * bootstrap interval resampling trials within each condition (`BOOTSTRAP_RESAMPLES`,
 * `BOOTSTRAP_SEED`) and the two-sided permutation p (`CONDITION_PERMUTATIONS` splits of
 * the pooled trials, seed `CONDITION_PERMUTATION_SEED`; all of them, exactly, when there are
 * no more: `permutations` says how many the p counts). The numbers are null when either
 * condition has no trial.
 */
export function conditionDifference(
  pair: { first: string; second: string; chosenBy: ConditionPairSource },
  firstDeltaHz: ArrayLike<number>,
  secondDeltaHz: ArrayLike<number>,
): ConditionDifferenceView {
  const both = firstDeltaHz.length > 0 && secondDeltaHz.length > 0;
  const test = both
    ? meanDifferencePermutationTest(firstDeltaHz, secondDeltaHz, {
        resamples: CONDITION_PERMUTATIONS,
        seed: CONDITION_PERMUTATION_SEED,
      })
    : null;
  return {
    ...pair,
    differenceHz: both ? meanOf(firstDeltaHz) - meanOf(secondDeltaHz) : null,
    ciHz: bootstrapMeanDifferenceInterval(firstDeltaHz, secondDeltaHz, {
      resamples: BOOTSTRAP_RESAMPLES,
      seed: BOOTSTRAP_SEED,
    }),
    pValue: test ? test.pValue : null,
    permutations: test ? test.resamples : CONDITION_PERMUTATIONS,
    seed: CONDITION_PERMUTATION_SEED,
  };
}

function meanOf(values: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  return sum / values.length;
}
