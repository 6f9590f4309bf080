import { readScipyFixture } from '../testing/scipy-fixtures';
import { BOOTSTRAP_RESAMPLES, BOOTSTRAP_SEED } from '../pipeline/analysis-settings';
import { bootstrapMeanDifferenceInterval } from './two-sample-bootstrap';

interface BootstrapFixture {
  source: string;
  cases: {
    name: string;
    first: number[];
    second: number[];
    ciHz: [number, number];
    standardError: number;
    referenceResamples: number;
  }[];
}

const fixture = readScipyFixture<BootstrapFixture>('condition-bootstrap.json');

/**
 * Monte-Carlo standard deviation of a percentile-interval end from B resamples: the 2.5 %
 * quantile of B draws has SD √(q(1 − q)/B) / f(x_q) (asymptotic variance of a sample
 * quantile, common practice), and for a near-normal bootstrap distribution of SD s the
 * density there is φ(1.96)/s. So SD ≈ 0.0598·s for B = 2000 and 0.0060·s for B = 200000.
 */
function quantileSd(resamples: number, standardError: number): number {
  const q = 0.025;
  const density = Math.exp(-(1.959963984540054 ** 2) / 2) / Math.sqrt(2 * Math.PI);
  return (Math.sqrt((q * (1 - q)) / resamples) / density) * standardError;
}

describe('two-sample percentile bootstrap against scipy.stats.bootstrap', () => {
  it('has the cases it checks', () => {
    expect(fixture.cases.length).toBeGreaterThanOrEqual(4);
  });

  // Source: scipy.stats.bootstrap(method='percentile', paired=False) with 200000 resamples.
  // Both are Monte-Carlo estimates of the same interval, so the ends agree within five
  // combined standard deviations (a false alarm below 1e-6 per end); skewed data make the
  // density at the quantile differ from the normal one, hence five and not four.
  it.each(fixture.cases.map((c) => [c.name, c] as const))(
    'puts the ends of %s within the Monte-Carlo tolerance of scipy',
    (_name, c) => {
      for (const resamples of [BOOTSTRAP_RESAMPLES, c.referenceResamples]) {
        const ci = bootstrapMeanDifferenceInterval(c.first, c.second, {
          resamples,
          seed: BOOTSTRAP_SEED,
        });
        if (ci === null) throw new Error('no interval');
        const tolerance =
          5 *
          Math.hypot(
            quantileSd(resamples, c.standardError),
            quantileSd(c.referenceResamples, c.standardError),
          );
        expect(Math.abs(ci[0] - c.ciHz[0])).toBeLessThan(tolerance);
        expect(Math.abs(ci[1] - c.ciHz[1])).toBeLessThan(tolerance);
      }
    },
  );

  it('is fixed by its seed and resamples each group on its own', () => {
    const first = [-0.6, -0.4, -0.5, -0.3, -0.7];
    const second = [0.1, -0.1, 0, 0.2];
    const ci = bootstrapMeanDifferenceInterval(first, second);
    expect(bootstrapMeanDifferenceInterval(first, second)).toEqual(ci);
    expect(bootstrapMeanDifferenceInterval(first, second, { seed: 1 })).not.toEqual(ci);
    // Every resample draws within each group, so no difference can leave
    // [min(first) − max(second), max(first) − min(second)] = [−0.9, −0.3] (closed form).
    if (ci === null) throw new Error('no interval');
    expect(ci[0]).toBeGreaterThanOrEqual(-0.9);
    expect(ci[1]).toBeLessThanOrEqual(-0.3);
    // Constant groups: every resample gives the same difference.
    expect(bootstrapMeanDifferenceInterval([2, 2, 2], [0.5, 0.5])).toEqual([1.5, 1.5]);
    expect(bootstrapMeanDifferenceInterval([], [1])).toBeNull();
  });
});
