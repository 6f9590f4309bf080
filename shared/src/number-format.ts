/**
 * Gyre's one number formatter: the client's screens (frontend/src/lib/format.ts) and the
 * visit report PDF (backend/src/report-document/report-numbers.ts) both write numbers
 * through here, so the same quantity reads the same everywhere.
 *
 * - Negatives carry the true minus sign (U+2212), which has the width of a tabular digit.
 * - A value is rounded first and signed after: what rounds to zero prints as 0.00, never
 *   −0.00 or +0.00.
 * - Signed changes (Δf, slopes, window edges) show + for positive values.
 * - A unit always follows, after a no-break space (U+00A0), so a number never wraps away
 *   from its unit.
 * - Precision is per quantity, set once in {@link QUANTITIES}.
 *
 * Hand-written over Intl.NumberFormat: its `signDisplay: 'exceptZero'` does the same job but
 * writes a hyphen-minus, and its output differs between ICU builds (Node and browsers).
 */

/** U+2212 MINUS SIGN. */
export const MINUS_SIGN = '\u2212';
/** U+00A0 NO-BREAK SPACE, between a number and its unit. */
export const UNIT_SPACE = '\u00A0';
/** What a missing value reads as. */
export const NO_VALUE = '—';

type Maybe = number | null | undefined;

/** How one kind of number is written. */
export interface QuantityFormat {
  unit: string;
  /** Digits after the decimal point (exclusive with `significant`). */
  decimals?: number;
  /** Significant digits instead of fixed decimals (for values over many decades). */
  significant?: number;
  /** Show + for positive values (a change, a slope, a window edge relative to onset). */
  signed?: boolean;
}

/**
 * The precision table. Frequencies to 0.01 Hz: the Welch grid is 0.25 Hz and interpolation
 * refines it below that, but no further than a hundredth is meaningful; the same for changes
 * and slopes.
 */
export const QUANTITIES = {
  /** An absolute frequency: PAF, CoG, band edges, sampling rates shown as such. */
  frequencyHz: { unit: 'Hz', decimals: 2 },
  /** A frequency change (Δf, its CI, a flag threshold): always signed. */
  deltaFHz: { unit: 'Hz', decimals: 2, signed: true },
  /** A trend: Theil–Sen slope. */
  slopeHzPerYear: { unit: 'Hz/year', decimals: 2, signed: true },
  /** A duration (recording length, epoch). */
  durationS: { unit: 's', decimals: 1 },
  /** A time relative to stimulus onset (window edges, axis): signed, to 0.1 s. */
  timeFromOnsetS: { unit: 's', decimals: 1, signed: true },
  /** A point on the curve's time grid (tooltips). */
  sampleTimeS: { unit: 's', decimals: 3, signed: true },
  /** Power spectral density, spanning decades: three significant digits. */
  powerUv2PerHz: { unit: 'µV²/Hz', significant: 3 },
  /** Peak prominence and other power ratios in decibels. */
  decibel: { unit: 'dB', decimals: 1 },
  /** A share, written as a percentage (pass the percentage, not the share). */
  percent: { unit: '%', decimals: 1 },
  /** An amplitude (channel standard deviation). */
  amplitudeUv: { unit: 'µV', decimals: 1 },
  /** A power ratio without unit written as "times". */
  times: { unit: 'times', decimals: 1 },
  /** Minutes of recording. */
  minutes: { unit: 'min', decimals: 1 },
} as const satisfies Record<string, QuantityFormat>;

export type Quantity = keyof typeof QUANTITIES;

/**
 * A bare number at fixed decimals with the true minus sign; rounded first, then signed.
 * `signed: true` adds + to positive values (never to zero).
 */
export function formatNumber(
  value: number,
  decimals: number,
  options: { signed?: boolean } = {},
): string {
  if (!Number.isFinite(value)) return NO_VALUE;
  const text = Math.abs(value).toFixed(decimals);
  return withSign(value, text, options.signed === true);
}

/** A bare number to `digits` significant digits, in plain decimals (0.000123, 45600). */
export function formatSignificant(
  value: number,
  digits: number,
  options: { signed?: boolean } = {},
): string {
  if (!Number.isFinite(value)) return NO_VALUE;
  const magnitude = Math.abs(value);
  if (magnitude === 0) return '0';
  // toPrecision may answer in exponent form; decimals from the magnitude keep plain digits.
  const exponent = Math.floor(Math.log10(Number(magnitude.toPrecision(digits))));
  const decimals = Math.max(0, digits - 1 - exponent);
  const rounded = Number(magnitude.toPrecision(digits));
  const text = decimals > 100 ? rounded.toString() : rounded.toFixed(decimals);
  return withSign(value, text, options.signed === true);
}

/** A number of a known quantity with its unit, e.g. `−0.50 Hz`; null/NaN read "—". */
export function formatQuantity(value: Maybe, quantity: Quantity): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  const format: QuantityFormat = QUANTITIES[quantity];
  return `${quantityNumber(value, format)}${UNIT_SPACE}${format.unit}`;
}

/** Two values of one quantity with the unit once: `−0.41 to −0.15 Hz`. */
export function formatQuantityRange(
  range: readonly [number, number] | null | undefined,
  quantity: Quantity,
  joiner = ' to ',
): string {
  if (range === null || range === undefined) return NO_VALUE;
  const [low, high] = range;
  if (!Number.isFinite(low) || !Number.isFinite(high)) return NO_VALUE;
  const format: QuantityFormat = QUANTITIES[quantity];
  return `${quantityNumber(low, format)}${joiner}${quantityNumber(high, format)}${UNIT_SPACE}${format.unit}`;
}

export const formatHz = (value: Maybe): string => formatQuantity(value, 'frequencyHz');
export const formatDeltaHz = (value: Maybe): string => formatQuantity(value, 'deltaFHz');
export const formatSlopeHzPerYear = (value: Maybe): string =>
  formatQuantity(value, 'slopeHzPerYear');
export const formatPowerUv2PerHz = (value: Maybe): string => formatQuantity(value, 'powerUv2PerHz');

/**
 * A p value without its "p": below 0.001 as `< 0.001`, otherwise to three decimals (common
 * reporting practice: an exact p to three decimals, and "< 0.001" where three decimals would
 * read 0.000).
 */
export function formatPValue(p: Maybe): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return NO_VALUE;
  return p < 0.001 ? '<\u00A00.001' : p.toFixed(3);
}

/** A share in [0, 1] as a percentage, `12.5 %`. */
export function formatShareAsPercent(share: Maybe): string {
  if (share === null || share === undefined || !Number.isFinite(share)) return NO_VALUE;
  return formatQuantity(share * 100, 'percent');
}

function quantityNumber(value: number, format: QuantityFormat): string {
  const options = { signed: format.signed === true };
  return format.significant !== undefined
    ? formatSignificant(value, format.significant, options)
    : formatNumber(value, format.decimals ?? 2, options);
}

/** Rounds first, then signs: a value that rounds to zero has no sign at all. */
function withSign(value: number, absoluteText: string, alwaysSign: boolean): string {
  if (Number(absoluteText) === 0) return absoluteText;
  if (value < 0) return `${MINUS_SIGN}${absoluteText}`;
  return alwaysSign ? `+${absoluteText}` : absoluteText;
}
