import type { AuditEntryView } from '@gyre/shared';

export const AUDIT_CSV_COLUMNS = [
  'seq',
  'at',
  'actorId',
  'actorEmail',
  'action',
  'objectType',
  'objectId',
  'studyId',
  'siteId',
  'reason',
  'clientIp',
  'before',
  'after',
  'prevHash',
  'hash',
] as const;

/**
 * One CSV field (RFC 4180 quoting). A text starting with = + - @ or a tab is prefixed with an
 * apostrophe so that a spreadsheet does not run it as a formula (OWASP "CSV injection").
 */
export function csvField(value: unknown): string {
  let text =
    value === null || value === undefined
      ? ''
      : typeof value === 'string'
        ? value
        : typeof value === 'number'
          ? String(value)
          : JSON.stringify(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvHeader(): string {
  return `${AUDIT_CSV_COLUMNS.join(',')}\r\n`;
}

export function csvLine(entry: AuditEntryView): string {
  return `${AUDIT_CSV_COLUMNS.map((column) => csvField(entry[column])).join(',')}\r\n`;
}
