import { EdfFormatError } from './edf-format-error';

/**
 * Numeric header fields are ASCII text padded with spaces (Kemp et al. 1992). Only
 * plain decimal notation is accepted: no hex, no 'Infinity', no empty field.
 */
const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const INTEGER = /^[+-]?\d+$/;

/** Parses a decimal header field; throws EdfFormatError naming `field` otherwise. */
export function parseEdfNumber(text: string, field: string): number {
  const trimmed = text.trim();
  const value = DECIMAL.test(trimmed) ? Number(trimmed) : Number.NaN;
  if (!Number.isFinite(value)) {
    throw new EdfFormatError(field, `'${trimmed}'`, 'a decimal number');
  }
  return value;
}

/** Parses an integer header field; throws EdfFormatError naming `field` otherwise. */
export function parseEdfInteger(text: string, field: string): number {
  const trimmed = text.trim();
  if (!INTEGER.test(trimmed) || !Number.isSafeInteger(Number(trimmed))) {
    throw new EdfFormatError(field, `'${trimmed}'`, 'an integer');
  }
  return Number(trimmed);
}

/**
 * Shortest decimal text of `value` that fits `width` characters, for header fields
 * (Kemp et al. 1992: 8 ASCII characters) and TAL onsets; never exponent notation,
 * which the EDF+ TAL grammar does not allow (Kemp & Olivan 2003). Returns null when
 * the value cannot be written in that width.
 */
export function formatEdfNumber(value: number, width: number, maxDecimals = 9): string | null {
  // toFixed switches to exponent notation at 1e21; no EDF field is that wide anyway.
  if (!Number.isFinite(value) || Math.abs(value) >= 1e15) return null;
  for (let decimals = maxDecimals; decimals >= 0; decimals--) {
    let text = value.toFixed(decimals);
    if (text.includes('.')) text = text.replace(/0+$/, '').replace(/\.$/, '');
    if (text === '-0') text = '0';
    if (text.length <= width) return text;
  }
  return null;
}
