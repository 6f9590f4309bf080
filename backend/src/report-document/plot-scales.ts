/** Maps a data value to a page coordinate in points. */
export interface Scale {
  domain: [number, number];
  range: [number, number];
  toPt(value: number): number;
  ticks: number[];
  log: boolean;
}

/**
 * Tick step of 1, 2 or 5 × 10^k giving about `targetCount` intervals over the span (common
 * practice for chart axes).
 */
export function niceStep(span: number, targetCount: number): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / Math.max(1, targetCount);
  const power = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / power;
  const nice = fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10;
  return nice * power;
}

/** Domain widened to whole steps, and the ticks on it. */
export function niceLinearDomain(
  min: number,
  max: number,
  targetCount = 5,
): { domain: [number, number]; ticks: number[]; step: number } {
  let low = min;
  let high = max;
  if (!(high > low)) {
    // One value (or none): a band of ±0.5 around it keeps the axis readable.
    low = (Number.isFinite(min) ? min : 0) - 0.5;
    high = low + 1;
  }
  const step = niceStep(high - low, targetCount);
  const decimals = stepDecimals(step);
  const domain: [number, number] = [
    Number((Math.floor(low / step) * step).toFixed(decimals)),
    Number((Math.ceil(high / step) * step).toFixed(decimals)),
  ];
  return { domain, ticks: ticksBetween(domain[0], domain[1], step), step };
}

/** Ticks at multiples of `step` inside [low, high], rounded to the step's decimals. */
export function ticksBetween(low: number, high: number, step: number): number[] {
  const decimals = stepDecimals(step);
  const out: number[] = [];
  for (let k = Math.ceil(low / step - 1e-9); k * step <= high + step * 1e-9; k++) {
    out.push(Number((k * step).toFixed(decimals)));
  }
  return out;
}

/** Decimals enough to write multiples of `step` exactly (one spare against float noise). */
function stepDecimals(step: number): number {
  return Math.max(0, -Math.floor(Math.log10(step)) + 1);
}

export function linearScale(
  domain: [number, number],
  range: [number, number],
  ticks: number[],
): Scale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  return {
    domain,
    range,
    ticks,
    log: false,
    toPt: (value) => r0 + ((value - d0) / (d1 - d0)) * (r1 - r0),
  };
}

/** Decades covering [min, max] of positive values; ticks at 1, 2, 5 × 10^k when few decades. */
export function logScale(min: number, max: number, range: [number, number]): Scale {
  const safeMin = min > 0 ? min : 1e-6;
  const safeMax = max > safeMin ? max : safeMin * 10;
  const lowExp = Math.floor(Math.log10(safeMin));
  const highExp = Math.max(lowExp + 1, Math.ceil(Math.log10(safeMax)));
  const domain: [number, number] = [10 ** lowExp, 10 ** highExp];
  const ticks: number[] = [];
  const decades = highExp - lowExp;
  for (let e = lowExp; e <= highExp; e++) {
    for (const mantissa of decades <= 2 ? [1, 2, 5] : [1]) {
      const value = mantissa * 10 ** e;
      if (value >= domain[0] && value <= domain[1]) ticks.push(value);
    }
  }
  const [r0, r1] = range;
  const [l0, l1] = [lowExp, highExp];
  return {
    domain,
    range,
    ticks,
    log: true,
    toPt: (value) => r0 + ((Math.log10(Math.max(value, domain[0])) - l0) / (l1 - l0)) * (r1 - r0),
  };
}

/** Short tick label: plain decimals for 0.01–10 000, otherwise 1e-3 style. */
export function tickLabel(value: number): string {
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 0.01 && magnitude < 10000) {
    const text = Number(value.toPrecision(6)).toString();
    return text.replace(/-/g, '\u2212');
  }
  const exponent = Math.floor(Math.log10(magnitude));
  const mantissa = Number((value / 10 ** exponent).toPrecision(3));
  const head = mantissa === 1 ? '' : `${mantissa}×`;
  return `${head}1e${exponent}`.replace(/-/g, '\u2212');
}
