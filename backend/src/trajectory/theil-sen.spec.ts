import { execFileSync } from 'node:child_process';
import { theilSenSlope, yearsBetween } from './theil-sen';

/** scipy.stats.theilslopes (SciPy 1.17, Debian python3-scipy) on the same points: the reference. */
function scipyTheilSen(x: number[], y: number[]): number {
  const script = `import json,sys\nfrom scipy.stats import theilslopes\nd=json.load(sys.stdin)\nprint(repr(float(theilslopes(d['y'], d['x'])[0])))`;
  const out = execFileSync('python3', ['-c', script], { input: JSON.stringify({ x, y }) });
  return Number(out.toString().trim());
}

describe('theilSenSlope', () => {
  it('matches scipy.stats.theilslopes on generated points with one outlier', () => {
    // Generated: a 0.3 Hz/year decline from 10.2 Hz with small noise and one bad visit.
    const x = [0, 0.5, 1.1, 1.4, 2.0, 2.6, 3.1];
    const y = x.map((t, i) => 10.2 - 0.3 * t + [0.02, -0.01, 0.03, -2.5, 0.0, 0.01, -0.02][i]);
    expect(theilSenSlope(x.map((xi, i) => ({ x: xi, y: y[i] })))).toBeCloseTo(
      scipyTheilSen(x, y),
      12,
    );
  });

  it('matches scipy with an even number of pair slopes and tied x values', () => {
    const x = [0, 1, 1, 2, 3];
    const y = [9.8, 9.9, 9.7, 9.5, 9.6];
    expect(theilSenSlope(x.map((xi, i) => ({ x: xi, y: y[i] })))).toBeCloseTo(
      scipyTheilSen(x, y),
      12,
    );
  });

  it('gives null without two distinct x values', () => {
    expect(theilSenSlope([{ x: 1, y: 2 }])).toBeNull();
    expect(
      theilSenSlope([
        { x: 1, y: 2 },
        { x: 1, y: 3 },
      ]),
    ).toBeNull();
  });

  it('counts years as days / 365.25 (mean Julian year, IAU)', () => {
    expect(yearsBetween('2024-01-01', '2025-01-01')).toBeCloseTo(366 / 365.25, 12);
  });
});
