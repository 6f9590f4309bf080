import {
  formatDeltaHz as sharedDeltaHz,
  formatHz as sharedHz,
  formatNumber as sharedNumber,
  formatPValue as sharedPValue,
  formatQuantity,
  formatQuantityRange,
  formatShareAsPercent as sharedShareAsPercent,
  formatSignificant,
  formatSlopeHzPerYear as sharedSlopeHzPerYear,
  NO_VALUE,
  UNIT_SPACE,
} from '@gyre/shared';
import dayjs from 'dayjs';

/**
 * Every date and number on screen goes through here, so one style holds everywhere. The
 * numbers come from @gyre/shared's number-format.ts, which the visit report PDF uses too:
 * true minus sign (U+2212), no negative zero, + on signed changes, a unit after a no-break
 * space, one precision per quantity.
 */

export { formatQuantity, formatQuantityRange, formatSignificant, NO_VALUE };

type Maybe = number | null | undefined;

export function formatDate(value: string | null | undefined): string {
  if (value === null || value === undefined || value === '') return NO_VALUE;
  const date = dayjs(value);
  return date.isValid() ? date.format('D MMM YYYY') : value;
}

export function formatDateTime(value: string | null | undefined): string {
  if (value === null || value === undefined || value === '') return NO_VALUE;
  const date = dayjs(value);
  return date.isValid() ? date.format('D MMM YYYY, HH:mm:ss') : value;
}

const SECOND_MS = 1000;
const MINUTE_MS = 60 * SECOND_MS;
const HOUR_MS = 60 * MINUTE_MS;
const DAY_MS = 24 * HOUR_MS;

/** A distance in whole units, the largest first; each rounded down. */
function distanceParts(ms: number): Array<[number, string]> {
  if (ms < MINUTE_MS) return [[Math.floor(ms / SECOND_MS), 's']];
  if (ms < HOUR_MS) return [[Math.floor(ms / MINUTE_MS), 'min']];
  if (ms < DAY_MS) {
    return [
      [Math.floor(ms / HOUR_MS), 'h'],
      [Math.floor((ms % HOUR_MS) / MINUTE_MS), 'min'],
    ];
  }
  return [
    [Math.floor(ms / DAY_MS), 'd'],
    [Math.floor((ms % DAY_MS) / HOUR_MS), 'h'],
  ];
}

/**
 * A time stamp of a visit still blinded for the viewer (blinded review). The server sends it as
 * its distance from the visit's first upload, counted from 1970-01-01T00:00:00Z, so it is
 * written as that distance and never as a date: `at first upload` under one second, else
 * `+40 s`, `+12 min`, `+2 h 5 min` or `+3 d 4 h`, then `after first upload`. Seconds only under
 * a minute, minutes alone under an hour, else the two largest units (a second one of 0 left
 * out); each is rounded down, so a later time never reads as earlier. Hand-written: dayjs's
 * duration plugin formats one fixed pattern, not the largest units.
 */
export function formatAfterFirstUpload(value: string | null | undefined): string {
  if (value === null || value === undefined || value === '') return NO_VALUE;
  const ms = Date.parse(value);
  if (Number.isNaN(ms)) return NO_VALUE;
  if (ms < SECOND_MS) return 'at first upload';
  const distance = distanceParts(ms)
    .filter(([n]) => n > 0)
    .map(([n, unit]) => `${sharedNumber(n, 0)}${UNIT_SPACE}${unit}`)
    .join(' ');
  return `+${distance} after first upload`;
}

/** A frequency to two decimals with its unit, e.g. `10.25 Hz`. */
export function formatHz(value: Maybe): string {
  return sharedHz(value);
}

/** A frequency change, always signed: `+0.05 Hz`, `−0.50 Hz`, and `0.00 Hz` for what rounds to 0. */
export function formatDeltaHz(value: Maybe): string {
  return sharedDeltaHz(value);
}

/** A Theil–Sen slope: `+0.12 Hz/year`. */
export function formatSlopeHzPerYear(value: Maybe): string {
  return sharedSlopeHzPerYear(value);
}

/** Two frequencies (a band) with the unit once: `8.00 to 13.00 Hz`. */
export function formatHzRange(range: readonly [number, number] | null | undefined): string {
  return formatQuantityRange(range, 'frequencyHz');
}

/** A confidence interval of a change: `−0.41 to −0.15 Hz`. */
export function formatDeltaHzRange(range: readonly [number, number] | null | undefined): string {
  return formatQuantityRange(range, 'deltaFHz');
}

/** Power spectral density to three significant digits: `0.0123 µV²/Hz`. */
export function formatPowerUv2PerHz(value: Maybe): string {
  return formatQuantity(value, 'powerUv2PerHz');
}

/** A duration; one decimal unless asked otherwise. */
export function formatSeconds(value: Maybe, decimals = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  return `${sharedNumber(value, decimals)}${UNIT_SPACE}s`;
}

/** A time relative to stimulus onset, signed: `−1.0 s`, `+0.5 s`. */
export function formatTimeFromOnsetS(value: Maybe): string {
  return formatQuantity(value, 'timeFromOnsetS');
}

/** A percentage (pass the percentage, not the share); one decimal unless asked otherwise. */
export function formatPercent(value: Maybe, decimals = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  return `${sharedNumber(value, decimals)}${UNIT_SPACE}%`;
}

/** A share in [0, 1] as a percentage: 0.125 → `12.5 %`. */
export function formatShareAsPercent(share: Maybe): string {
  return sharedShareAsPercent(share);
}

/** A bare number (a ratio, a count of a mean) at fixed decimals, with the true minus sign. */
export function formatNumber(
  value: Maybe,
  decimals: number,
  options?: { signed?: boolean },
): string {
  if (value === null || value === undefined) return NO_VALUE;
  return sharedNumber(value, decimals, options);
}

/**
 * A count with its noun, singular for exactly one: `1 row`, `0 rows`, `1,204 files`. The noun
 * takes an `s` unless its plural is given (`formatCount(n, 'entry', 'entries')`).
 */
export function formatCount(count: number, noun: string, plural = `${noun}s`): string {
  return `${sharedNumber(count, 0)} ${count === 1 ? noun : plural}`;
}

/** A p value without its "p": `< 0.001` or three decimals. */
export function formatPValue(value: Maybe): string {
  return sharedPValue(value);
}

const BYTE_UNITS = ['B', 'KB', 'MB', 'GB'] as const;

/** Sizes in decimal units (1 MB = 10⁶ bytes), one decimal above bytes. */
export function formatBytes(bytes: Maybe): string {
  if (bytes === null || bytes === undefined || !Number.isFinite(bytes)) return NO_VALUE;
  let value = bytes;
  let unit = 0;
  while (value >= 1000 && unit < BYTE_UNITS.length - 1) {
    value /= 1000;
    unit += 1;
  }
  const number = unit === 0 ? sharedNumber(value, 0) : sharedNumber(value, 1);
  return `${number}${UNIT_SPACE}${BYTE_UNITS[unit]}`;
}
