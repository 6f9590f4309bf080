import dayjs from 'dayjs';

/** Every date and number on screen goes through here, so one style holds everywhere. */

export function formatDate(value: string | null | undefined): string {
  if (value === null || value === undefined || value === '') return '—';
  const date = dayjs(value);
  return date.isValid() ? date.format('D MMM YYYY') : value;
}

export function formatDateTime(value: string | null | undefined): string {
  if (value === null || value === undefined || value === '') return '—';
  const date = dayjs(value);
  return date.isValid() ? date.format('D MMM YYYY, HH:mm:ss') : value;
}

/** Frequencies to two decimals with their unit, e.g. `10.25 Hz`. */
export function formatHz(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value)
    ? '—'
    : `${value.toFixed(2)} Hz`;
}

export function formatSeconds(value: number | null | undefined, decimals = 1): string {
  return value === null || value === undefined || !Number.isFinite(value)
    ? '—'
    : `${value.toFixed(decimals)} s`;
}

export function formatPercent(value: number | null | undefined, decimals = 0): string {
  return value === null || value === undefined || !Number.isFinite(value)
    ? '—'
    : `${value.toFixed(decimals)} %`;
}

const BYTE_UNITS = ['B', 'KB', 'MB', 'GB'] as const;

/** Sizes in decimal units (1 MB = 10⁶ bytes), one decimal above bytes. */
export function formatBytes(bytes: number | null | undefined): string {
  if (bytes === null || bytes === undefined || !Number.isFinite(bytes)) return '—';
  let value = bytes;
  let unit = 0;
  while (value >= 1000 && unit < BYTE_UNITS.length - 1) {
    value /= 1000;
    unit += 1;
  }
  return unit === 0 ? `${value} B` : `${value.toFixed(1)} ${BYTE_UNITS[unit]}`;
}
