import { tickIncrement, ticks as d3Ticks } from 'd3-array';
import { scaleLinear, scaleLog, scaleUtc } from 'd3-scale';
import { formatNumber, formatSignificant } from './number-format';

/**
 * Axis ticks for every chart of Gyre, on screen and in the visit report PDF: d3's
 * nice-number algorithm (d3-array `ticks`/`tickIncrement`: steps of 1, 2 or 5 × 10^k) for
 * linear axes, d3-scale's log and UTC time scales for the others. Each tick comes with its
 * label, written at a precision derived from the step so that no two labels are the same.
 */

export interface AxisTick {
  value: number;
  label: string;
}

/**
 * The narrowest span of a frequency axis: values shown to 0.01 Hz get ticks at least
 * 0.02 Hz apart (see `minSpan`).
 */
export const MIN_AXIS_SPAN_HZ = 0.1;

export interface LinearAxis {
  /** The axis's extent: widened to whole steps when `nice`, else the given one. */
  domain: [number, number];
  ticks: AxisTick[];
  /** Distance between ticks (1, 2 or 5 × 10^k). */
  step: number;
  /** Decimals of every label: enough to write the step exactly. */
  decimals: number;
}

export interface LinearAxisOptions {
  /** About how many intervals (d3's count); the step is the nice one nearest span / count. */
  count?: number;
  /** Widen the domain outwards to whole steps (default true). */
  nice?: boolean;
  /** + on positive labels (a time relative to onset, a change). */
  signed?: boolean;
  /** At least this many decimals (e.g. 1 for seconds: "−1.0"). */
  minDecimals?: number;
  /**
   * Widen a narrower extent to this span around its middle, so nearly equal values do not
   * get ticks finer than the quantity's precision (e.g. 0.1 Hz for frequencies shown to 0.01).
   */
  minSpan?: number;
}

/** Where there is one value or none, an axis of ±0.5 around it (or around 0). */
function usableExtent(min: number, max: number): [number, number] {
  const finite = [min, max].filter(Number.isFinite);
  if (finite.length === 0) return [-0.5, 0.5];
  const low = Math.min(...finite);
  const high = Math.max(...finite);
  return high > low ? [low, high] : [low - 0.5, low + 0.5];
}

/**
 * The tick step and its decimals from d3's `tickIncrement`: a non-negative increment is the
 * step itself; a negative one −k means a step of 1/k with k = 1, 2 or 5 × 10^j, written
 * exactly with ceil(log10 k) decimals (k = 2 → 0.5: 1; k = 20 → 0.05: 2).
 */
function stepOf(low: number, high: number, count: number): { step: number; decimals: number } {
  const increment = tickIncrement(low, high, count);
  if (increment > 0) return { step: increment, decimals: 0 };
  const k = -increment;
  return { step: 1 / k, decimals: Math.ceil(Math.log10(k) - 1e-12) };
}

/** Linear ticks at a nice step with distinct labels (true minus sign, no −0). */
export function linearAxis(min: number, max: number, options: LinearAxisOptions = {}): LinearAxis {
  const count = Math.max(1, Math.round(options.count ?? 5));
  let [low, high] = usableExtent(min, max);
  const minSpan = options.minSpan ?? 0;
  if (high - low < minSpan) {
    const middle = (low + high) / 2;
    [low, high] = [middle - minSpan / 2, middle + minSpan / 2];
  }
  if (options.nice !== false) {
    [low, high] = scaleLinear().domain([low, high]).nice(count).domain() as [number, number];
  }
  let { step, decimals } = stepOf(low, high, count);
  let values = d3Ticks(low, high, count);
  if (values.length === 0) {
    // A domain narrower than any nice step inside it: its ends, at enough decimals.
    values = [low, high];
    step = high - low;
    decimals = Math.max(0, Math.ceil(-Math.log10(step)) + 1);
  }
  decimals = Math.max(decimals, options.minDecimals ?? 0);
  const signed = options.signed === true;
  return {
    domain: [low, high],
    step,
    decimals,
    ticks: values.map((value) => ({ value, label: formatNumber(value, decimals, { signed }) })),
  };
}

export interface LogAxis {
  /** Whole decades covering the values. */
  domain: [number, number];
  ticks: AxisTick[];
}

/** Plain decimals between these magnitudes; E notation outside, for every tick alike. */
const PLAIN_RANGE: [number, number] = [1e-3, 1e5];

/**
 * Log ticks at 1, 2 and 5 × 10^k while they fit in `maxTicks`, else at powers of ten only
 * (every n-th decade if even those are too many), all in one notation: plain decimals
 * (0.2, 1, 50) when every tick lies in [0.001, 100 000], else E notation (1e−7, 2e−6: the
 * shipped fonts have no superscript minus or digits beyond ¹²³, so 10⁻⁷ would not print).
 */
export function logAxis(min: number, max: number, options: { maxTicks?: number } = {}): LogAxis {
  const maxTicks = Math.max(2, options.maxTicks ?? 8);
  const safeMin = Number.isFinite(min) && min > 0 ? min : 1e-6;
  const safeMax = Number.isFinite(max) && max > safeMin ? max : safeMin * 10;
  const scale = scaleLog().domain([safeMin, safeMax]).nice();
  const [low, high] = scale.domain() as [number, number];
  const lowExp = Math.round(Math.log10(low));
  const highExp = Math.max(lowExp + 1, Math.round(Math.log10(high)));
  const domain: [number, number] = [10 ** lowExp, 10 ** highExp];
  const decades = highExp - lowExp;
  const candidates = scaleLog().domain(domain).ticks();
  const mantissaOf = (v: number) => Math.round(v / 10 ** Math.floor(Math.log10(v) + 1e-9));
  let values: number[];
  if (3 * decades + 1 <= maxTicks) {
    values = candidates.filter((v) => [1, 2, 5].includes(mantissaOf(v)));
  } else {
    const every = Math.ceil((decades + 1) / maxTicks);
    values = [];
    for (let e = lowExp; e <= highExp; e += every) values.push(10 ** e);
  }
  const plain = values.every((v) => v >= PLAIN_RANGE[0] && v < PLAIN_RANGE[1]);
  return {
    domain,
    ticks: values.map((value) => ({
      value,
      label: plain ? formatSignificant(value, 1) : powerOfTen(value),
    })),
  };
}

function powerOfTen(value: number): string {
  const exponent = Math.floor(Math.log10(value) + 1e-9);
  const mantissa = Math.round(value / 10 ** exponent);
  return `${mantissa}e${formatNumber(exponent, 0)}`;
}

export type DateTickUnit = 'year' | 'month' | 'day';

export interface DateAxis {
  domain: [number, number];
  ticks: AxisTick[];
  /** What one tick stands for; labels name the year only where it starts or changes. */
  unit: DateTickUnit;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

const DAY_MS = 86_400_000;

/**
 * Calendar ticks in UTC from d3-scale's `scaleUtc().ticks()` (years, months, weeks or days,
 * whichever gives about `count`), labelled so that each month or year is named once:
 * years as "2026"; months as "Nov 2026", "Dec", "Jan 2027" (the year on the first tick and
 * where it changes); days as "2 Nov 2026", "16 Nov", "1 Dec". Ticks inside a day are left
 * out: visit dates have no time of day.
 */
export function dateAxis(minMs: number, maxMs: number, options: { count?: number } = {}): DateAxis {
  const count = Math.max(1, Math.round(options.count ?? 5));
  // One date (or none): a fortnight either side.
  const [low, high] =
    maxMs > minMs
      ? [minMs, maxMs]
      : [
          (Number.isFinite(minMs) ? minMs : 0) - 14 * DAY_MS,
          (Number.isFinite(minMs) ? minMs : 0) + 14 * DAY_MS,
        ];
  const dates = scaleUtc()
    .domain([new Date(low), new Date(high)])
    .ticks(count)
    .filter((d) => d.getTime() % DAY_MS === 0);
  const unit: DateTickUnit =
    dates.length > 0 && dates.every((d) => d.getUTCDate() === 1 && d.getUTCMonth() === 0)
      ? 'year'
      : dates.length > 0 && dates.every((d) => d.getUTCDate() === 1)
        ? 'month'
        : 'day';
  const ticks = dates.map((date, i) => {
    const year = date.getUTCFullYear();
    const month = MONTHS[date.getUTCMonth()];
    const newYear = i === 0 || dates[i - 1].getUTCFullYear() !== year;
    const label =
      unit === 'year'
        ? String(year)
        : unit === 'month'
          ? newYear
            ? `${month} ${year}`
            : month
          : newYear
            ? `${date.getUTCDate()} ${month} ${year}`
            : `${date.getUTCDate()} ${month}`;
    return { value: date.getTime(), label };
  });
  return { domain: [low, high], ticks, unit };
}

/** A date as the axes and tooltips write it: "3 Nov 2026" (UTC). */
export function formatUtcDay(ms: number): string {
  const date = new Date(ms);
  return `${date.getUTCDate()} ${MONTHS[date.getUTCMonth()]} ${date.getUTCFullYear()}`;
}

/**
 * The label of the tick at `value`, for chart libraries that hand back a value to label;
 * a value between ticks is written at the axis's precision.
 */
export function tickLabelAt(
  axis: { ticks: AxisTick[] },
  value: number,
  fallback: (value: number) => string = (v) => formatSignificant(v, 3),
): string {
  let best: AxisTick | undefined;
  for (const tick of axis.ticks) {
    if (best === undefined || Math.abs(tick.value - value) < Math.abs(best.value - value))
      best = tick;
  }
  if (best !== undefined && Math.abs(best.value - value) <= Math.abs(best.value) * 1e-9 + 1e-12) {
    return best.label;
  }
  return fallback(value);
}
