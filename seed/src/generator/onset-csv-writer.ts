/**
 * Writes stimulus onsets as the CSV Gyre reads (`onset_s,label`, docs/method.md §1), with
 * RFC 4180 quoting for a label that holds a comma, a quote or a line break.
 */
export function writeOnsetCsv(onsets: ReadonlyArray<{ onsetS: number; label: string }>): string {
  const quote = (text: string): string =>
    /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
  const rows = onsets.map((o) => `${formatSeconds(o.onsetS)},${quote(o.label)}`);
  return `onset_s,label\n${rows.join('\n')}\n`;
}

/** Seconds to the microsecond, without float noise such as 12.348000000000001. */
function formatSeconds(value: number): string {
  if (!Number.isFinite(value))
    throw new RangeError(`onset_s: ${value} found, a finite number expected`);
  return String(Number(value.toFixed(6)));
}
