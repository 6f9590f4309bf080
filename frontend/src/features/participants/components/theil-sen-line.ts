/** Mean Julian year, 365.25 days: the server's slopes are in Hz per year of this length. */
export const MS_PER_YEAR = 365.25 * 86_400_000;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/**
 * The two ends of a Theil–Sen trend line over the visits, given the server's slope. The
 * intercept is median(y) − slope · median(x), as `scipy.stats.theilslopes` defines it
 * (method "separate"), so the line passes where the robust slope puts the middle visit.
 */
export function theilSenLine(
  points: ReadonlyArray<{ timeMs: number; valueHz: number }>,
  slopeHzPerYear: number | null,
): [{ timeMs: number; valueHz: number }, { timeMs: number; valueHz: number }] | null {
  if (slopeHzPerYear === null || points.length < 2) return null;
  const origin = points[0].timeMs;
  const xs = points.map((p) => (p.timeMs - origin) / MS_PER_YEAR);
  const intercept = median(points.map((p) => p.valueHz)) - slopeHzPerYear * median(xs);
  const first = Math.min(...xs);
  const last = Math.max(...xs);
  const at = (x: number) => ({
    timeMs: origin + x * MS_PER_YEAR,
    valueHz: intercept + slopeHzPerYear * x,
  });
  return [at(first), at(last)];
}
