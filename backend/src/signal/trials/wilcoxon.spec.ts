import { readScipyFixture } from '../testing/scipy-fixtures';
import { erfc, normalSurvival } from './normal-distribution';
import { wilcoxonSignedRank } from './wilcoxon';

interface WilcoxonFixture {
  cases: { name: string; differences: number[]; statistic: number; pValue: number }[];
}

const fixture = readScipyFixture<WilcoxonFixture>('wilcoxon.json');

describe('Wilcoxon signed-rank test against scipy.stats.wilcoxon', () => {
  it.each(fixture.cases.map((c) => [c.name, c] as const))('matches scipy for %s', (_name, c) => {
    const result = wilcoxonSignedRank(c.differences);
    expect(result.statistic).toBe(c.statistic);
    // p is rounded to 13 digits in the fixture.
    expect(Math.abs(result.pValue - c.pValue) / c.pValue).toBeLessThan(1e-9);
    const expectedMethod = c.name.split('-')[0];
    expect(result.method).toBe(expectedMethod);
  });

  it('refuses NaN differences', () => {
    expect(() => wilcoxonSignedRank([0.1, NaN])).toThrow(/finite numbers/);
  });
});

describe('normal tail', () => {
  it('matches known values of erfc (from memory, to 15 digits)', () => {
    expect(erfc(0)).toBe(1);
    expect(Math.abs(erfc(1) - 0.157299207050285) / 0.157299207050285).toBeLessThan(1e-13);
    expect(Math.abs(erfc(3) - 2.20904969985854e-5) / 2.20904969985854e-5).toBeLessThan(1e-12);
    expect(Math.abs(normalSurvival(1.959963984540054) - 0.025)).toBeLessThan(1e-15);
  });

  it('is continuous where the series hands over to the continued fraction', () => {
    const below = erfc(2 - 1e-12);
    const above = erfc(2 + 1e-12);
    expect(Math.abs(below - above) / above).toBeLessThan(1e-10);
  });
});
