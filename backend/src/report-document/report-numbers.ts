import dayjs from 'dayjs';
import utc from 'dayjs/plugin/utc';

dayjs.extend(utc);

/** The typographic minus (U+2212), as in the client, so that signs line up in tabular figures. */
const MINUS = '\u2212';

/** Frequencies to 0.01 Hz: the Welch grid is 0.25 Hz, interpolation refines it below that. */
export function formatHz(valueHz: number, decimals = 2): string {
  return `${signed(valueHz, decimals, false)} Hz`;
}

/** A change in Hz to 0.001 Hz with its sign always shown (+ or −): slowing must read as such. */
export function formatDeltaHz(valueHz: number): string {
  return `${signed(valueHz, 3, true)} Hz`;
}

export function formatCiHz([lowHz, highHz]: [number, number]): string {
  return `${signed(lowHz, 3, true)} to ${signed(highHz, 3, true)} Hz`;
}

/** p to three decimals; below 0.001 as "< 0.001" (common practice). */
export function formatPValue(p: number): string {
  return p < 0.001 ? '< 0.001' : p.toFixed(3);
}

export function formatPercent(share: number, decimals = 1): string {
  return `${signed(share * 100, decimals, false)} %`;
}

export function formatSeconds(valueS: number, decimals = 1): string {
  return `${signed(valueS, decimals, false)} s`;
}

/** A plain number with the typographic minus. */
export function formatNumber(value: number, decimals: number): string {
  return signed(value, decimals, false);
}

/** ISO 8601 → "2026-12-01 22:31:05 UTC": signatures state their time zone. */
export function formatUtc(iso: string): string {
  const parsed = dayjs.utc(iso);
  if (!parsed.isValid()) throw new Error(`Not an ISO 8601 date-time: found "${iso}".`);
  return `${parsed.format('YYYY-MM-DD HH:mm:ss')} UTC`;
}

/** Rounds first, then signs: a value that rounds to zero prints without a sign, never −0.00. */
function signed(value: number, decimals: number, alwaysSign: boolean): string {
  const text = Math.abs(value).toFixed(decimals);
  const isZero = Number(text) === 0;
  if (value < 0 && !isZero) return `${MINUS}${text}`;
  return alwaysSign && !isZero ? `+${text}` : text;
}
