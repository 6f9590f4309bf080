/**
 * Time-stamped Annotations Lists (TALs) of EDF+ `EDF Annotations` signals
 * (Kemp & Olivan 2003, section 2.2):
 *
 *   TAL      = Onset [0x15 Duration] 0x14 { Text 0x14 } 0x00
 *   Onset    = ('+' | '-') digits ['.' digits]      (seconds after the file start)
 *   Duration = digits ['.' digits]                  (seconds)
 *
 * Texts are UTF-8. Unused bytes after the last TAL of a record are 0x00. The first TAL
 * of the first annotation signal of each record starts with an empty text: its onset is
 * the record's start time (the time-keeping TAL).
 */
import { EdfFormatError } from './edf-format-error';

export interface Tal {
  onsetS: number;
  durationS: number | null;
  texts: string[];
}

const PLUS = 0x2b;
const MINUS = 0x2d;
const DOT = 0x2e;
const DURATION_MARK = 0x15;
const TEXT_END = 0x14;
const TAL_END = 0x00;

const utf8 = new TextDecoder('utf-8', { fatal: true });

const isDigit = (b: number): boolean => b >= 0x30 && b <= 0x39;

function show(b: number | undefined): string {
  if (b === undefined) return 'end of the annotation bytes';
  return b >= 0x20 && b <= 0x7e
    ? `'${String.fromCharCode(b)}'`
    : `0x${b.toString(16).padStart(2, '0')}`;
}

/**
 * Parses every TAL in `bytes` (one annotation signal's bytes in one data record).
 * @param where names the record and signal in error messages, e.g. "record 3, signal 5".
 */
export function parseTals(bytes: Uint8Array, where: string): Tal[] {
  const tals: Tal[] = [];
  let pos = 0;
  const fail = (what: string, expected: string): never => {
    throw new EdfFormatError(`TAL (${where}, byte ${pos})`, what, expected);
  };
  /** Reads digits ['.' digits] from pos; returns the text read. */
  const readDecimal = (what: string): string => {
    const start = pos;
    while (pos < bytes.length && isDigit(bytes[pos])) pos++;
    if (pos === start) fail(show(bytes[pos]), `a digit in the ${what}`);
    if (bytes[pos] === DOT) {
      pos++;
      const fractionStart = pos;
      while (pos < bytes.length && isDigit(bytes[pos])) pos++;
      if (pos === fractionStart) fail(show(bytes[pos]), `a digit after '.' in the ${what}`);
    }
    let text = '';
    for (let i = start; i < pos; i++) text += String.fromCharCode(bytes[i]);
    return text;
  };

  while (pos < bytes.length) {
    if (bytes[pos] === TAL_END) {
      pos++; // padding between or after TALs
      continue;
    }
    const sign = bytes[pos];
    if (sign !== PLUS && sign !== MINUS) fail(show(sign), "'+' or '-' starting a TAL onset");
    pos++;
    const onsetText = readDecimal('onset');
    const onsetS = Number(onsetText) * (sign === MINUS ? -1 : 1);
    // 400 digits are a valid decimal and an infinite time: a broken file, not a long one.
    if (!Number.isFinite(onsetS)) fail(`'${onsetText.slice(0, 20)}…'`, 'a finite onset');
    let durationS: number | null = null;
    if (bytes[pos] === DURATION_MARK) {
      pos++;
      const durationText = readDecimal('duration');
      durationS = Number(durationText);
      if (!Number.isFinite(durationS)) fail(`'${durationText.slice(0, 20)}…'`, 'a finite duration');
    }
    if (bytes[pos] !== TEXT_END) fail(show(bytes[pos]), '0x14 after the onset/duration');
    pos++;
    const texts: string[] = [];
    while (pos < bytes.length && bytes[pos] !== TAL_END) {
      const start = pos;
      while (pos < bytes.length && bytes[pos] !== TEXT_END && bytes[pos] !== TAL_END) pos++;
      if (bytes[pos] !== TEXT_END) fail(show(bytes[pos]), '0x14 ending the annotation text');
      try {
        texts.push(utf8.decode(bytes.subarray(start, pos)));
      } catch {
        throw new EdfFormatError(`TAL (${where}, byte ${start})`, 'invalid UTF-8 text', 'UTF-8');
      }
      pos++;
    }
    if (pos >= bytes.length) fail(show(undefined), '0x00 ending the TAL');
    pos++;
    tals.push({ onsetS, durationS, texts });
  }
  return tals;
}
