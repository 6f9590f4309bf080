import { execFileSync } from 'node:child_process';
import { trendOf } from './trend-rule';

/** scipy.stats.theilslopes (SciPy, Debian python3-scipy): the reference slope, x in years. */
function scipySlope(x: number[], y: number[]): number {
  const script = `import json,sys\nfrom scipy.stats import theilslopes\nd=json.load(sys.stdin)\nprint(repr(float(theilslopes(d['y'], d['x'])[0])))`;
  const out = execFileSync('python3', ['-c', script], { input: JSON.stringify({ x, y }) });
  return Number(out.toString().trim());
}

const RULE = { minVisits: 3, minSpanDays: 90 };

describe('trendOf: the study rule for a trend slope', () => {
  it('gives the slope at exactly 3 visits spanning exactly 90 days, as scipy computes it', () => {
    // 2026-01-01 → 2026-04-01 is 31 + 28 + 31 = 90 calendar days.
    const points = [
      { date: '2026-01-01', value: 10.0 },
      { date: '2026-02-15', value: 9.9 },
      { date: '2026-04-01', value: 9.7 },
    ];
    const trend = trendOf(points, RULE);
    expect(trend.reason).toBeNull();
    expect(trend.visits).toBe(3);
    expect(trend.spanDays).toBe(90);
    expect(trend.slopeHzPerYear).toBeCloseTo(
      scipySlope(
        [0, 45, 90].map((d) => d / 365.25),
        points.map((p) => p.value),
      ),
      12,
    );
  });

  it.each([
    [
      'at 89 days: span-too-short, with the actual span',
      [
        { date: '2026-01-01', value: 10.0 },
        { date: '2026-02-15', value: 9.9 },
        { date: '2026-03-31', value: 9.7 },
      ],
      { reason: 'span-too-short', visits: 3, spanDays: 89 },
    ],
    [
      'with 2 visits however far apart: too-few-visits, with the count',
      [
        { date: '2026-01-15', value: 10.0 },
        { date: '2026-07-16', value: 9.0 },
      ],
      { reason: 'too-few-visits', visits: 2, spanDays: 182 },
    ],
  ])('gives none %s', (_name, points, expected) => {
    expect(trendOf(points, RULE)).toEqual({ slopeHzPerYear: null, ...expected });
  });

  it('names too few visits before a short span (two visits eleven days apart)', () => {
    expect(
      trendOf(
        [
          { date: '2026-03-01', value: 10.0 },
          { date: '2026-03-12', value: 9.5 },
        ],
        RULE,
      ).reason,
    ).toBe('too-few-visits');
    expect(trendOf([], RULE)).toEqual({
      slopeHzPerYear: null,
      reason: 'too-few-visits',
      visits: 0,
      spanDays: 0,
    });
  });

  it('follows the study setting: 4 visits over 180 days', () => {
    const three = [
      { date: '2026-01-01', value: 10.0 },
      { date: '2026-04-01', value: 9.8 },
      { date: '2026-07-01', value: 9.6 },
    ];
    const rule = { minVisits: 4, minSpanDays: 180 };
    expect(trendOf(three, rule).reason).toBe('too-few-visits');
    const four = [...three, { date: '2026-06-29', value: 9.7 }];
    // 2026-01-01 → 2026-07-01 = 181 days ≥ 180.
    expect(trendOf(four, rule).reason).toBeNull();
    expect(trendOf(four, { minVisits: 4, minSpanDays: 182 })).toMatchObject({
      reason: 'span-too-short',
      spanDays: 181,
    });
  });
});
