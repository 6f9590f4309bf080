import {
  formatDeltaHz as sharedDeltaHz,
  formatHz as sharedHz,
  formatNumber as sharedNumber,
  formatPValue as sharedPValue,
  formatQuantityRange,
  formatShareAsPercent,
  formatSlopeHzPerYear as sharedSlope,
  UNIT_SPACE,
} from '@gyre/shared';
import dayjs from 'dayjs';
import utc from 'dayjs/plugin/utc';

dayjs.extend(utc);

/*
 * The report's numbers come from @gyre/shared's number-format.ts, the formatter the client's
 * screens use: the same quantity has the same precision, sign and unit on screen and on paper.
 */

/** Frequencies to 0.01 Hz (the precision table in shared/src/number-format.ts). */
export function formatHz(valueHz: number): string {
  return sharedHz(valueHz);
}

/** A change in Hz with its sign always shown (+ or −): slowing must read as such. */
export function formatDeltaHz(valueHz: number): string {
  return sharedDeltaHz(valueHz);
}

export function formatCiHz(range: [number, number]): string {
  return formatQuantityRange(range, 'deltaFHz');
}

export function formatSlopeHzPerYear(value: number): string {
  return sharedSlope(value);
}

/** p to three decimals; below 0.001 as "< 0.001". */
export function formatPValue(p: number): string {
  return sharedPValue(p);
}

/** A share in [0, 1] as a percentage to 0.1 %. */
export function formatPercent(share: number): string {
  return formatShareAsPercent(share);
}

export function formatSeconds(valueS: number, decimals = 1): string {
  return `${sharedNumber(valueS, decimals)}${UNIT_SPACE}s`;
}

/** A plain number with the typographic minus. */
export function formatNumber(value: number, decimals: number, signed = false): string {
  return sharedNumber(value, decimals, { signed });
}

/** ISO 8601 → "2026-12-01 22:31:05 UTC": signatures state their time zone. */
export function formatUtc(iso: string): string {
  const parsed = dayjs.utc(iso);
  if (!parsed.isValid()) throw new Error(`Not an ISO 8601 date-time: found "${iso}".`);
  return `${parsed.format('YYYY-MM-DD HH:mm:ss')} UTC`;
}
