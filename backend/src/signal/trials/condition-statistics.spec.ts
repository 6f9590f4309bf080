import {
  chooseConditionPair,
  conditionDifference,
  CONDITION_PERMUTATION_SEED,
  CONDITION_PERMUTATIONS,
  groupConditions,
} from './condition-statistics';
import { meanDifferencePermutationTest } from './permutation-test';
import { bootstrapMeanDifferenceInterval } from './two-sample-bootstrap';

describe('groupConditions', () => {
  it('groups labels case-insensitively under the first spelling, in order of appearance', () => {
    expect(groupConditions(['Tone', 'word', ' tone ', 'WORD', 'Noise', 'tone', '  '])).toEqual([
      { label: 'Tone', trials: [0, 2, 5] },
      { label: 'word', trials: [1, 3] },
      { label: 'Noise', trials: [4] },
    ]);
    expect(groupConditions([])).toEqual([]);
  });
});

describe('chooseConditionPair', () => {
  const found = ['Tone', 'Word', 'Noise'];

  it('takes the first two found unless a pair is named', () => {
    expect(chooseConditionPair(found, null)).toEqual({
      pair: ['Tone', 'Word'],
      chosenBy: 'first-two',
    });
    expect(chooseConditionPair(['Tone'], null)).toEqual({ pair: null, unknown: [] });
  });

  it('matches a named pair case-insensitively; a request wins over the settings', () => {
    expect(chooseConditionPair(found, ['noise', 'TONE'])).toEqual({
      pair: ['Noise', 'Tone'],
      chosenBy: 'settings',
    });
    expect(chooseConditionPair(found, ['Noise', 'Tone'], ['word', 'noise'])).toEqual({
      pair: ['Word', 'Noise'],
      chosenBy: 'request',
    });
  });

  it('names the labels nothing matches', () => {
    expect(chooseConditionPair(found, ['Tone', 'Click'])).toEqual({
      pair: null,
      unknown: ['Click'],
    });
  });
});

describe('conditionDifference', () => {
  const first = [-0.61, -0.42, -0.55, -0.48, -0.7, -0.39, -0.52];
  const second = [0.05, -0.1, 0.12, -0.02, 0.08, 0.0];
  const pair = { first: 'Tone', second: 'Word', chosenBy: 'first-two' as const };

  it('is the difference of the means with the two-sample bootstrap and the permutation p', () => {
    const view = conditionDifference(pair, first, second);
    const mean = (v: number[]): number => v.reduce((a, b) => a + b, 0) / v.length;
    // Closed form: the difference of the two arithmetic means.
    expect(view.differenceHz).toBeCloseTo(mean(first) - mean(second), 14);
    expect(view.ciHz).toEqual(bootstrapMeanDifferenceInterval(first, second));
    const test = meanDifferencePermutationTest(first, second, {
      resamples: CONDITION_PERMUTATIONS,
      seed: CONDITION_PERMUTATION_SEED,
    });
    expect(view.pValue).toBe(test.pValue);
    // C(13, 6) = 1716 splits ≤ 5000: all enumerated, and the count is what the view reports.
    expect(test.exact).toBe(true);
    expect(view.permutations).toBe(1716);
    expect(view.seed).toBe(CONDITION_PERMUTATION_SEED);
    // Fully separated groups: the exact two-sided p is 2/1716 (one extreme split per side).
    expect(view.pValue).toBeCloseTo(2 / 1716, 15);
    expect(view).toMatchObject(pair);
  });

  it('has no numbers when a condition has no trial', () => {
    const view = conditionDifference(pair, first, []);
    expect(view.differenceHz).toBeNull();
    expect(view.ciHz).toBeNull();
    expect(view.pValue).toBeNull();
    expect(view.permutations).toBe(CONDITION_PERMUTATIONS);
  });
});
