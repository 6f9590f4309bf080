/**
 * Onset CSVs (`onset_s,label[,duration_s]`, Gyre's docs/method.md §1; quoting as RFC 4180) built
 * beside a base recording, and their mutations. The server receives the CSV as bytes and
 * decodes it as UTF-8 (invalid sequences become U+FFFD); byte-level mutations go through the
 * same decoding, so the parser sees exactly what it would see behind the upload.
 */
import type { Rng } from '../seeded-random';
import type { Mutated } from './edf-mutations';

export interface OnsetCsvCase {
  text: string;
  name: string;
}

export type CsvMutationFamily =
  | 'bit-flip'
  | 'insert-char'
  | 'delete-char'
  | 'cell'
  | 'header'
  | 'rows'
  | 'quote'
  | 'truncate'
  | 'size'
  | 'stacked';

export const CSV_FAMILY_WEIGHTS: ReadonlyArray<readonly [CsvMutationFamily, number]> = [
  ['bit-flip', 10],
  ['insert-char', 10],
  ['delete-char', 8],
  ['cell', 20],
  ['header', 10],
  ['rows', 12],
  ['quote', 8],
  ['truncate', 8],
  ['size', 4],
  ['stacked', 10],
];

// prettier-ignore
const CELL_EXTREMES = [
  '', ' ', '-1', '-0', '0', '+0', '1e309', '-1e309', '1e-400', 'NaN', 'Infinity', '0x10', '1,5',
  '\u0661\u0662', '\uff11', '3 s', '3s', '.5', '5.', '1e', 'e1', '1.2.3', '99999999999999999999',
  '4.9e-324', '1.7976931348623157e308', '\u00a0', '\u0000', '"', '""', '"1"', '\ufeff1',
];

const INSERTABLE = [
  ',',
  '"',
  '\n',
  '\r',
  '\r\n',
  '\t',
  ' ',
  '\u0000',
  '\ufeff',
  '\u00e9',
  '\u2028',
  ';',
  '-',
  '.',
  'e',
  '\ud800',
];

/** A valid CSV for `onsetsS` (inside `durationS`), in one of the shapes the parser accepts. */
export function baseOnsetCsv(rng: Rng, onsetsS: readonly number[], durationS: number): string {
  const withDuration = rng.bool(0.3);
  const newline = rng.pick(['\n', '\r\n', '\r']);
  const onsets = onsetsS.length > 0 ? onsetsS : [0, durationS / 2];
  const rows = onsets.map((t, i) => {
    const label = rng.pick(['stimulus', 'go', '"go, left"', 'Reiz ö', `cue ${i}`]);
    const duration = withDuration
      ? `,${rng.bool(0.8) ? Math.min(0.1, Math.max(0, durationS - t)) : ''}`
      : '';
    return `${t},${label}${duration}`;
  });
  const header = withDuration ? 'onset_s,label,duration_s' : 'onset_s,label';
  const bom = rng.bool(0.1) ? '\ufeff' : '';
  return `${bom}${header}${newline}${rows.join(newline)}${rng.bool(0.7) ? newline : ''}`;
}

/** What the server does to the uploaded part: bytes decoded as UTF-8, U+FFFD for bad bytes. */
function throughUtf8(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8');
}

function splitLines(text: string): string[] {
  return text.split(/\r\n|\n|\r/);
}

function mutateCells(rng: Rng, text: string): OnsetCsvCase {
  const lines = splitLines(text);
  if (lines.length < 2)
    return { text: `${text}\n${rng.pick(CELL_EXTREMES)},x`, name: 'cell appended' };
  const line = rng.int(1, lines.length - 1);
  const cells = lines[line].split(',');
  const column = rng.int(0, cells.length - 1);
  const value = rng.weighted<() => string>([
    [() => rng.pick(CELL_EXTREMES), 6],
    [() => String(Number(cells[column]) + rng.pick([1000, -1000, 0.001, -0.001])), 2],
    [() => 'x'.repeat(rng.int(1000, 100_000)), 1],
  ])();
  cells[column] = value;
  lines[line] = cells.join(',');
  const shown = value.length > 40 ? `${value.length} chars` : JSON.stringify(value);
  return { text: lines.join('\n'), name: `cell line ${line + 1} col ${column + 1}=${shown}` };
}

function mutateHeader(rng: Rng, text: string): OnsetCsvCase {
  const lines = splitLines(text);
  const header = rng.pick([
    '',
    'ONSET_S,LABEL',
    ' onset_s , label ',
    'onset_s;label',
    'onset,label',
    'onset_s,label,duration_s,extra',
    'label,onset_s',
    'onset_s',
    '"onset_s","label"',
    '"onset_s,label"',
    'onset_s,label,',
    '\ufeff\ufeffonset_s,label',
  ]);
  if (rng.bool(0.2)) return { text: lines.slice(1).join('\n'), name: 'header dropped' };
  lines[0] = header;
  return { text: lines.join('\n'), name: `header=${JSON.stringify(header)}` };
}

function mutateRows(rng: Rng, text: string): OnsetCsvCase {
  const lines = splitLines(text);
  const body = lines.slice(1);
  const r = rng.int(0, Math.max(0, body.length - 1));
  const [name, next] = rng.pick<() => [string, string[]]>([
    () => ['reversed', body.slice().reverse()],
    () => [`duplicate ${r + 2}`, [...body.slice(0, r + 1), body[r] ?? '', ...body.slice(r + 1)]],
    () => ['no rows', []],
    () => ['blank rows only', ['', ' ', '\t']],
    () => [`extra field ${r + 2}`, body.map((l, i) => (i === r ? `${l},extra` : l))],
    () => [`missing field ${r + 2}`, body.map((l, i) => (i === r ? l.split(',')[0] : l))],
    () => ['onset past the end', [...body, '1e6,late']],
    () => ['negative onset', ['-0.5,early', ...body]],
  ])();
  return { text: [lines[0], ...next].join('\n'), name: `rows ${name}` };
}

function mutateQuotes(rng: Rng, text: string): OnsetCsvCase {
  const lines = splitLines(text);
  const line = rng.int(0, lines.length - 1);
  const variant = rng.pick([
    (l: string) => `"${l}`,
    (l: string) => `${l}"`,
    (l: string) => l.replace(',', ',"'),
    (l: string) => l.replace(',', '","'),
    (l: string) => `${l.split(',')[0]},"a""b"x`,
    (l: string) => `${l.split(',')[0]},"multi\nline"`,
    (l: string) => `${l.split(',')[0]}, "spaced"`,
  ]);
  lines[line] = variant(lines[line]);
  return { text: lines.join('\n'), name: `quote line ${line + 1}` };
}

/** The server's limit for the onset part (recordings/upload/upload-receiver.ts): 4 MiB. */
export const ONSET_CSV_LIMIT_BYTES = 4 * 1024 * 1024;

/**
 * Large CSVs up to the server's limit for the part, as a technician could send: many rows,
 * many blank lines, one huge (quoted) label. The parser must stay within the time budget at
 * the limit, not only for the few rows a real session has.
 */
function mutateSize(rng: Rng, text: string, durationS: number): OnsetCsvCase {
  const target = rng.int(ONSET_CSV_LIMIT_BYTES / 8, ONSET_CSV_LIMIT_BYTES - 64);
  return rng.pick<() => OnsetCsvCase>([
    () => {
      const rows = Math.floor(target / 12);
      const body: string[] = [];
      for (let i = 0; i < rows; i++) body.push(`${((i * durationS) / rows).toFixed(6)},s`);
      return { text: `onset_s,label\n${body.join('\n')}\n`, name: `size ${rows} rows` };
    },
    () => {
      const filler = rng.pick(['\n', '\r\n', ',', ' ', '9']);
      const repeat = Math.floor((target - text.length) / filler.length);
      return {
        text: `${text}${filler.repeat(repeat)}`,
        name: `size +${repeat} x ${JSON.stringify(filler)}`,
      };
    },
    () => {
      const quoted = rng.bool();
      const label = (quoted ? '""' : 'x').repeat(Math.floor(target / (quoted ? 2 : 1)));
      return {
        text: `onset_s,label\n0,${quoted ? `"${label}"` : label}\n`,
        name: `size label of ${label.length} chars${quoted ? ' (quoted, doubled quotes)' : ''}`,
      };
    },
  ])();
}

const SINGLE: Record<
  Exclude<CsvMutationFamily, 'stacked'>,
  (rng: Rng, text: string, durationS: number) => OnsetCsvCase
> = {
  'bit-flip': (rng, text) => {
    const bytes = new TextEncoder().encode(text);
    const n = rng.int(1, 8);
    for (let i = 0; i < n && bytes.length > 0; i++)
      bytes[rng.int(0, bytes.length - 1)] ^= 1 << rng.int(0, 7);
    return { text: throughUtf8(bytes), name: `bit-flip x${n}` };
  },
  'insert-char': (rng, text) => {
    const at = rng.int(0, text.length);
    const ch = rng.pick(INSERTABLE);
    return {
      text: text.slice(0, at) + ch + text.slice(at),
      name: `insert ${JSON.stringify(ch)} @${at}`,
    };
  },
  'delete-char': (rng, text) => {
    const at = rng.int(0, Math.max(0, text.length - 1));
    return { text: text.slice(0, at) + text.slice(at + 1), name: `delete @${at}` };
  },
  cell: mutateCells,
  header: mutateHeader,
  rows: mutateRows,
  quote: mutateQuotes,
  truncate: (rng, text) => {
    const at = rng.int(0, text.length);
    return { text: text.slice(0, at), name: `truncate @${at}` };
  },
  size: mutateSize,
};

export function mutateOnsetCsv(
  text: string,
  family: CsvMutationFamily,
  rng: Rng,
  durationS: number,
): Mutated & { text: string } {
  let current: OnsetCsvCase;
  if (family === 'stacked') {
    const names: string[] = [];
    current = { text, name: '' };
    for (let i = rng.int(2, 4); i > 0; i--) {
      const next = rng.weighted(
        CSV_FAMILY_WEIGHTS.filter(([f]) => f !== 'stacked' && f !== 'size'),
      );
      current = SINGLE[next as Exclude<CsvMutationFamily, 'stacked'>](rng, current.text, durationS);
      names.push(current.name);
    }
    current = { text: current.text, name: `stacked [${names.join(' | ')}]` };
  } else {
    current = SINGLE[family](rng, text, durationS);
  }
  // As the server holds it: a JavaScript string decoded from UTF-8 bytes (lone surrogates gone).
  const normalised = throughUtf8(new TextEncoder().encode(current.text));
  return { text: normalised, bytes: new TextEncoder().encode(normalised), name: current.name };
}
