import type { TrendView } from '@gyre/shared';
import { theilSenSlope, yearsBetween } from './theil-sen';

/** The study's rule for drawing a trend (study settings `trendMinVisits`, `trendMinSpanDays`). */
export interface TrendRule {
  minVisits: number;
  minSpanDays: number;
}

const MS_PER_DAY = 86_400_000;

function dayNumber(date: string): number {
  return Date.parse(`${date}T00:00:00Z`) / MS_PER_DAY;
}

/**
 * A measure's trend over dated values (docs/method.md §5, "Trends"): the Theil–Sen slope in
 * Hz per year only when at least `minVisits` visits have a value and the first and last of
 * them are at least `minSpanDays` calendar days apart; otherwise no slope and why, with the
 * actual count and span. Too few visits is named before a short span.
 */
export function trendOf(
  points: ReadonlyArray<{ date: string; value: number }>,
  rule: TrendRule,
): TrendView {
  const days = points.map((p) => dayNumber(p.date));
  const spanDays = points.length < 2 ? 0 : Math.max(...days) - Math.min(...days);
  const visits = points.length;
  if (visits < rule.minVisits) {
    return { slopeHzPerYear: null, reason: 'too-few-visits', visits, spanDays };
  }
  if (spanDays < rule.minSpanDays) {
    return { slopeHzPerYear: null, reason: 'span-too-short', visits, spanDays };
  }
  const first = points.reduce((a, p) => (p.date < a ? p.date : a), points[0].date);
  const slope = theilSenSlope(points.map((p) => ({ x: yearsBetween(first, p.date), y: p.value })));
  // Only with every visit on one day (a rule allowing a 0-day span) is there no slope to give.
  return slope === null
    ? { slopeHzPerYear: null, reason: 'span-too-short', visits, spanDays }
    : { slopeHzPerYear: slope, reason: null, visits, spanDays };
}
