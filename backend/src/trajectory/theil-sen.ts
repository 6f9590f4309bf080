/**
 * Theil–Sen slope: the median of the slopes of every pair of points with different x,
 * robust to one bad visit (docs/method.md §5; as `scipy.stats.theilslopes` computes it).
 * Returns null with fewer than two distinct x values.
 */
export function theilSenSlope(points: ReadonlyArray<{ x: number; y: number }>): number | null {
  const slopes: number[] = [];
  for (let i = 0; i < points.length; i++) {
    for (let j = i + 1; j < points.length; j++) {
      const dx = points[j].x - points[i].x;
      if (dx !== 0) slopes.push((points[j].y - points[i].y) / dx);
    }
  }
  if (slopes.length === 0) return null;
  slopes.sort((a, b) => a - b);
  const mid = slopes.length >> 1;
  return slopes.length % 2 === 1 ? slopes[mid] : (slopes[mid - 1] + slopes[mid]) / 2;
}

const MS_PER_DAY = 86_400_000;
/** Mean Julian year (IAU): 365.25 days. */
const DAYS_PER_YEAR = 365.25;

/** Years between two `YYYY-MM-DD` dates (UTC calendar days / 365.25). */
export function yearsBetween(fromDate: string, toDate: string): number {
  return (
    (Date.parse(`${toDate}T00:00:00Z`) - Date.parse(`${fromDate}T00:00:00Z`)) /
    MS_PER_DAY /
    DAYS_PER_YEAR
  );
}
