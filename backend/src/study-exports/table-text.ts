/**
 * Cells and lines of the exported tables, written with csv-stringify: CSV per RFC 4180 (comma,
 * CRLF, fields with a comma, quote or line break quoted, inner quotes doubled) and TSV per the
 * BIDS common principles, "Tabular files" (tab, LF, missing values `n/a`, a value holding a tab
 * quoted).
 */
import { stringify } from 'csv-stringify/sync';

/** A cell before it is written: numbers keep every digit the results API sends. */
export type Cell = string | number | boolean | null;

export type TableFormat = 'csv' | 'tsv';

/**
 * A number exactly as the results API's JSON writes it (ECMAScript Number::toString: the
 * shortest decimal that reads back as the same double); a non-finite value is missing, as
 * JSON writes it null.
 */
export function numberText(value: number): string | null {
  return Number.isFinite(value) ? String(value) : null;
}

/**
 * A free-text cell of the CSV that starts with = + - @ or a tab gets a leading apostrophe, so a
 * spreadsheet never runs it as a formula (as the audit CSV does). Numbers are never touched.
 */
function guardedText(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

function cellText(cell: Cell, format: TableFormat, freeText: boolean): string {
  const missing = format === 'csv' ? '' : 'n/a';
  if (cell === null) return missing;
  if (typeof cell === 'number') return numberText(cell) ?? missing;
  if (typeof cell === 'boolean') return cell ? 'true' : 'false';
  if (cell === '') return missing;
  return format === 'csv' && freeText ? guardedText(cell) : cell;
}

const OPTIONS = {
  csv: { delimiter: ',', record_delimiter: '\r\n' },
  tsv: { delimiter: '\t', record_delimiter: '\n' },
} as const;

/**
 * Lines of one table (header included when `header` is given), one string per call so a
 * caller can stream, hash or count them. `freeText` names the columns holding text a person
 * typed (visit labels, group names): only those get the spreadsheet guard.
 */
export function tableText(
  format: TableFormat,
  rows: readonly (readonly Cell[])[],
  options: { header?: readonly string[]; freeText?: ReadonlySet<number> } = {},
): string {
  const free = options.freeText ?? new Set<number>();
  const records: string[][] = [];
  if (options.header !== undefined) records.push([...options.header]);
  for (const row of rows) records.push(row.map((c, i) => cellText(c, format, free.has(i))));
  if (records.length === 0) return '';
  const { delimiter, record_delimiter } = OPTIONS[format];
  return stringify(records, { delimiter, record_delimiter, quote: '"', escape: '"' });
}
