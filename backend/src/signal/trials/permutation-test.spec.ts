import { readScipyFixture } from '../testing/scipy-fixtures';
import { meanDifferencePermutationTest } from './permutation-test';

interface PermutationFixture {
  source: string;
  cases: {
    name: string;
    first: number[];
    second: number[];
    statistic: number;
    pValue: number;
    referenceExact: boolean;
    referenceResamples?: number | null;
  }[];
}

const fixture = readScipyFixture<PermutationFixture>('condition-permutation.json');

const RESAMPLES = 5000;
const SEED = 20190815;

describe('permutation test of a difference of means against scipy.stats.permutation_test', () => {
  const exact = fixture.cases.filter((c) => c.name.startsWith('exact-'));
  const monteCarlo = fixture.cases.filter((c) => c.name.startsWith('monte-carlo-'));

  it('has the cases it checks', () => {
    expect(exact.length).toBeGreaterThanOrEqual(5);
    expect(monteCarlo.length).toBeGreaterThanOrEqual(3);
  });

  // Source: scipy.stats.permutation_test, permutation_type='independent', two-sided: with
  // C(n, n1) ≤ n_resamples every split is enumerated, so the p is a ratio of counts and must
  // be scipy's (the fixture rounds it to 13 digits).
  it.each(exact.map((c) => [c.name, c] as const))('enumerates %s exactly as scipy', (_n, c) => {
    const result = meanDifferencePermutationTest(c.first, c.second, {
      resamples: RESAMPLES,
      seed: SEED,
    });
    expect(result.exact).toBe(true);
    expect(Math.abs(result.statistic - c.statistic)).toBeLessThan(1e-12);
    expect(Math.abs(result.pValue - c.pValue)).toBeLessThan(1e-12);
  });

  // Random splits: Gyre's p is 2·(K + 1)/(R + 1) with K ~ Binomial(R, q), q the one-sided
  // tail share (Ernst 2004, §3), so its standard deviation is 2·√(q(1 − q)/R); the
  // reference's own (200000 splits, or none when exact) adds in quadrature. Five standard
  // deviations plus the +1 of the estimator leave a false alarm below 1e-6 per case.
  it.each(monteCarlo.map((c) => [c.name, c] as const))(
    'draws %s within the binomial tolerance of scipy',
    (_n, c) => {
      const result = meanDifferencePermutationTest(c.first, c.second, {
        resamples: RESAMPLES,
        seed: SEED,
      });
      expect(result.exact).toBe(false);
      expect(result.resamples).toBe(RESAMPLES);
      expect(Math.abs(result.statistic - c.statistic)).toBeLessThan(1e-12);
      const q = Math.min(0.5, c.pValue / 2);
      const sdOurs = 2 * Math.sqrt((q * (1 - q)) / RESAMPLES);
      const sdReference = c.referenceResamples
        ? 2 * Math.sqrt((q * (1 - q)) / c.referenceResamples)
        : 0;
      const tolerance = 5 * Math.hypot(sdOurs, sdReference) + 2 / (RESAMPLES + 1);
      expect(Math.abs(result.pValue - c.pValue)).toBeLessThan(tolerance);
    },
  );

  it('gives the same p for the same seed and another for another seed (random splits)', () => {
    const c = monteCarlo.find((m) => m.name === 'monte-carlo-30-25');
    if (!c) throw new Error('fixture case monte-carlo-30-25 missing');
    const once = meanDifferencePermutationTest(c.first, c.second, { seed: SEED });
    const again = meanDifferencePermutationTest(c.first, c.second, { seed: SEED });
    const other = meanDifferencePermutationTest(c.first, c.second, { seed: SEED + 1 });
    expect(again.pValue).toBe(once.pValue);
    expect(other.pValue).not.toBe(once.pValue);
  });

  it('reaches the smallest p of its splits for fully separated samples (closed form)', () => {
    // 4 vs 4 fully separated: only the observed split is as extreme on its side, so the
    // exact two-sided p is 2/C(8, 4) = 2/70.
    const result = meanDifferencePermutationTest([1, 2, 3, 4], [5, 6, 7, 8], { seed: SEED });
    expect(result.pValue).toBe(2 / 70);
    expect(result.statistic).toBe(-4);
    // With random splits, p can never go below 2/(R + 1).
    const wide = meanDifferencePermutationTest(
      Array.from({ length: 30 }, (_, i) => i),
      Array.from({ length: 30 }, (_, i) => 100 + i),
      { seed: SEED, resamples: 999 },
    );
    expect(wide.pValue).toBe(2 / 1000);
  });

  it('refuses an empty sample and non-finite values', () => {
    expect(() => meanDifferencePermutationTest([], [1, 2], { seed: SEED })).toThrow(/both/);
    expect(() => meanDifferencePermutationTest([1, NaN], [1, 2], { seed: SEED })).toThrow(/finite/);
  });
});
