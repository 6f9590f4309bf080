/**
 * Stimulus onsets from a CSV file: header row `onset_s,label` or
 * `onset_s,label,duration_s`, then one onset per row (docs/method.md §1). Fields follow
 * RFC 4180 quoting, so a label may hold a comma when quoted (common practice).
 */

export interface StimulusOnset {
  /** Seconds after the recording's start. */
  onsetS: number;
  label: string;
  /** Seconds, or null when the file has no duration column or the cell is empty. */
  durationS: number | null;
  /** 1-based line number in the file, for messages that point back to it. */
  line: number;
}

export interface ParseOnsetCsvOptions {
  /** Length of the recording in seconds; onsets must lie in [0, recordingDurationS). */
  recordingDurationS: number;
}

/** A CSV problem, naming the 1-based line and column, the value found and what was expected. */
export class OnsetCsvError extends Error {
  readonly line: number;
  readonly column: number | null;
  readonly value: string;
  readonly expected: string;

  constructor(
    line: number,
    column: number | null,
    columnName: string | null,
    value: string,
    expected: string,
  ) {
    const where =
      column === null ? `line ${line}` : `line ${line}, column ${column} (${columnName})`;
    super(`${where}: ${value} found, ${expected} expected`);
    this.name = 'OnsetCsvError';
    this.line = line;
    this.column = column;
    this.value = value;
    this.expected = expected;
  }
}

const DECIMAL = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const HEADERS = [
  ['onset_s', 'label'],
  ['onset_s', 'label', 'duration_s'],
];

/** Splits one CSV line into fields (RFC 4180 quotes; "" inside quotes is one quote). */
function splitCsvLine(text: string, line: number): string[] {
  // Most lines hold no quote: one native split instead of a string built a character at a
  // time (measured: a 4 MiB CSV took 1–2 s that way).
  if (!text.includes('"')) return text.split(',');
  const fields: string[] = [];
  let field = '';
  let i = 0;
  let quoted = false;
  while (i < text.length) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i += 2;
        continue;
      }
      if (c === '"') {
        quoted = false;
        i++;
        if (i < text.length && text[i] !== ',') {
          throw new OnsetCsvError(
            line,
            fields.length + 1,
            'field',
            `'${text[i]}' after a closing quote`,
            "',' or end of line",
          );
        }
        continue;
      }
      field += c;
      i++;
      continue;
    }
    if (c === '"' && field.trim().length === 0) {
      quoted = true;
      field = '';
    } else if (c === ',') {
      fields.push(field);
      field = '';
    } else {
      field += c;
    }
    i++;
  }
  if (quoted)
    throw new OnsetCsvError(
      line,
      fields.length + 1,
      'field',
      'an unclosed quote',
      'a closing quote on the same line',
    );
  fields.push(field);
  return fields;
}

/**
 * Parses and validates an onset CSV. Throws `OnsetCsvError` at the first problem:
 * missing or wrong header, wrong number of fields, a value that is not a number, an
 * empty label, an onset before the previous one, or an onset (or its end, with a
 * duration) outside the recording. Blank lines are skipped.
 */
export function parseOnsetCsv(text: string, options: ParseOnsetCsvOptions): StimulusOnset[] {
  const { recordingDurationS } = options;
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const headerCells = splitCsvLine(lines[0] ?? '', 1).map((h) => h.trim().toLowerCase());
  const columns = HEADERS.find(
    (h) => h.length === headerCells.length && h.every((name, i) => name === headerCells[i]),
  );
  if (!columns) {
    throw new OnsetCsvError(
      1,
      null,
      null,
      `header '${lines[0] ?? ''}'`,
      "header row 'onset_s,label' or 'onset_s,label,duration_s'",
    );
  }
  const onsets: StimulusOnset[] = [];
  for (let index = 1; index < lines.length; index++) {
    const line = index + 1;
    if (lines[index].trim().length === 0) continue;
    const cells = splitCsvLine(lines[index], line);
    if (cells.length !== columns.length) {
      throw new OnsetCsvError(
        line,
        null,
        null,
        `${cells.length} fields`,
        `${columns.length} fields (${columns.join(',')})`,
      );
    }
    const number = (column: number): number => {
      const value = cells[column].trim();
      if (!DECIMAL.test(value)) {
        throw new OnsetCsvError(
          line,
          column + 1,
          columns[column],
          `'${value}'`,
          'a number of seconds (decimal point, no unit)',
        );
      }
      return Number(value);
    };
    const onsetS = number(0);
    const label = cells[1].trim();
    if (label.length === 0) throw new OnsetCsvError(line, 2, 'label', "''", 'a non-empty label');
    let durationS: number | null = null;
    if (columns.length === 3 && cells[2].trim().length > 0) {
      durationS = number(2);
      if (durationS < 0)
        throw new OnsetCsvError(
          line,
          3,
          'duration_s',
          `'${cells[2].trim()}'`,
          'a duration of at least 0 s',
        );
    }
    if (onsetS < 0 || onsetS >= recordingDurationS) {
      throw new OnsetCsvError(
        line,
        1,
        'onset_s',
        `'${cells[0].trim()}'`,
        `an onset inside the recording, 0 ≤ onset < ${recordingDurationS} s`,
      );
    }
    if (durationS !== null && onsetS + durationS > recordingDurationS) {
      throw new OnsetCsvError(
        line,
        3,
        'duration_s',
        `'${cells[2].trim()}' (ends at ${onsetS + durationS} s)`,
        `an end inside the recording, at most ${recordingDurationS} s`,
      );
    }
    const previous = onsets[onsets.length - 1];
    if (previous && onsetS < previous.onsetS) {
      throw new OnsetCsvError(
        line,
        1,
        'onset_s',
        `'${cells[0].trim()}'`,
        `onsets in non-decreasing order, at least ${previous.onsetS} (line ${previous.line})`,
      );
    }
    onsets.push({ onsetS, label, durationS, line });
  }
  if (onsets.length === 0)
    throw new OnsetCsvError(1, null, null, 'no onset rows', 'at least one onset after the header');
  return onsets;
}
