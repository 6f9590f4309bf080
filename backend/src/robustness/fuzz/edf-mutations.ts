/**
 * Mutations of a valid EDF/EDF+ file. Random bytes alone rarely get past the first header
 * check, so most mutations know the layout (Kemp et al. 1992) and the TAL grammar (Kemp &
 * Olivan 2003) and aim at what a reader must decide: field values at their extremes, sizes
 * that disagree, truncations exactly at a boundary, records out of place, TALs missing a
 * delimiter. Each returns new bytes and a short name saying what it did, printed with any
 * failure so the case can be understood without replaying it.
 */
import type { Rng } from '../seeded-random';
import {
  FIXED_FIELDS,
  FixedFieldName,
  fixedField,
  SIGNAL_FIELDS,
  SignalFieldName,
  signalField,
} from '../../signal/edf/testing/edf-field-layout';
import { EdfLayout, signalBytesIn } from './edf-layout';

export interface Mutated {
  bytes: Uint8Array;
  /** Family and detail, e.g. `header-field recordCount='-1'`. */
  name: string;
}

export type EdfMutationFamily =
  | 'bit-flip'
  | 'byte-run'
  | 'truncate'
  | 'extend'
  | 'header-field'
  | 'signal-field'
  | 'signal-count'
  | 'reframe'
  | 'records'
  | 'tal'
  | 'stacked';

/** How often each family is drawn. Structure-aware families dominate: they reach deeper. */
export const EDF_FAMILY_WEIGHTS: ReadonlyArray<readonly [EdfMutationFamily, number]> = [
  ['bit-flip', 10],
  ['byte-run', 8],
  ['truncate', 10],
  ['extend', 4],
  ['header-field', 16],
  ['signal-field', 16],
  ['signal-count', 3],
  ['reframe', 6],
  ['records', 9],
  ['tal', 14],
  ['stacked', 8],
];

/** Numbers a header field might hold: limits, signs, notations and non-numbers. */
// prettier-ignore
const NUMERIC_EXTREMES = [
  '-1', '0', '1', '-0', '+1', '2', '99999999', '-9999999', '1e308', '1e-300', '1E5', '1e999',
  '0.000001', '.5', '5.', 'NaN', 'Infinity', '-Inf', '', ' ', 'abc', '0x10', '1,5', '1 2', '-',
  '+', '.', 'e5', '2147483648', '65536', '32767', '32768', '-32768', '-32769', '4294967296',
  '9.9e307', '0.0', '-0.5', '00000001', '\u0663', '\uff11', '\u00e9', '\u00b5V',
];

const FIELD_VALUES: Partial<Record<FixedFieldName | SignalFieldName, readonly string[]>> = {
  version: ['0', '', '1', '00', ' 0', '0\u0000', 'X', '\u00ffBIOSEMI', '\u00e90'],
  // prettier-ignore
  startDate: [
    '00.00.00', '32.01.26', '29.02.25', '29.02.24', '15.13.26', 'yy.01.26', '15.01.yy',
    '15-01-26', '', '1.1.26', '99.99.99', 'ab.cd.ef', '15.01.84', '15.01.85', '31.04.26',
  ],
  startTime: ['24.00.00', '23.59.60', '12:00:00', '', '99.99.99', '1.2.3', '00.00.00', '-1.00.00'],
  reserved: [
    '',
    'EDF+C',
    'EDF+D',
    'EDF+',
    'EDF+X',
    'EDF',
    'edf+c',
    ' EDF+C',
    'EDF+CEDF+D',
    '\u00e9',
  ],
  recording: [
    'Startdate 15-JAN-2100 X X X',
    'Startdate 15-JAN-2026 X X X',
    'Startdate 31-FEB-2026 X X X',
    'Startdate X X X X',
    '',
    'Startdate 15-XXX-2026',
  ],
  patient: ['X X X X', '', 'X', 'MCH-0001 F 01-JAN-1950 Name_With_Ümlaut'],
  label: [
    '',
    'EDF Annotations',
    ' EDF Annotations',
    'edf annotations',
    'EDF Annotations!',
    'O1',
    'EEG O1-REF',
    'Ö1',
    '\u0000\u0000',
  ],
  dimension: ['uV', 'mV', 'V', '', '\u00b5V', 'nV', 'kV'],
};

/** Field value as bytes: Latin-1 for one-byte characters, UTF-8 beyond (non-ASCII on purpose). */
function encodeFieldText(value: string): number[] {
  const out: number[] = [];
  for (const ch of value) {
    const code = ch.codePointAt(0) as number;
    if (code <= 0xff) out.push(code);
    else out.push(...new TextEncoder().encode(ch));
  }
  return out;
}

/**
 * Writes `value` into [offset, offset + width): space-padded as the format asks, or (with
 * `spill`) not padded and not cut, so it overruns into the next field as a careless writer would.
 */
function writeField(
  bytes: Uint8Array,
  offset: number,
  width: number,
  value: string,
  spill = false,
): void {
  const encoded = encodeFieldText(value);
  const length = spill ? Math.min(encoded.length, bytes.length - offset) : width;
  for (let i = 0; i < length && offset + i < bytes.length; i++) {
    bytes[offset + i] = i < encoded.length ? encoded[i] : 0x20;
  }
}

function readText(bytes: Uint8Array, offset: number, width: number): string {
  let out = '';
  for (let i = offset; i < Math.min(offset + width, bytes.length); i++) {
    out += String.fromCharCode(bytes[i]);
  }
  return out.trim();
}

function concatBytes(...parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

function numericValue(rng: Rng, current: string): string {
  return rng.weighted<() => string>([
    [() => rng.pick(NUMERIC_EXTREMES), 6],
    [() => String(Number(current) + rng.pick([-1, 1, -2, 2, 10])), 2],
    [() => String(Number(current) * rng.pick([-1, 2, 0.5, 1000])), 2],
    [() => `${current}${rng.pick(['0', '.', 'e', '-', 'x'])}`, 1],
  ])();
}

function fieldValue(rng: Rng, name: FixedFieldName | SignalFieldName, current: string): string {
  const catalogue = FIELD_VALUES[name];
  if (catalogue && rng.bool(0.8)) return rng.pick(catalogue);
  if (
    [
      'headerBytes',
      'recordCount',
      'recordDuration',
      'signalCount',
      'physicalMin',
      'physicalMax',
      'digitalMin',
      'digitalMax',
      'samplesPerRecord',
    ].includes(name)
  ) {
    return numericValue(rng, current);
  }
  // Text fields: printable junk, control characters, or non-ASCII.
  return rng.pick([
    'x'.repeat(rng.int(1, 90)),
    '\u0001\u0002',
    '\u00ff\u00fe',
    'Ä Ö Ü ß µ',
    '\t',
    '',
  ]);
}

function bitFlips(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const out = bytes.slice();
  const n = rng.int(1, 16);
  for (let i = 0; i < n; i++) {
    // Half the flips land in the header, where a single bit changes the meaning of a field.
    const at = rng.bool() ? rng.int(0, layout.headerBytes - 1) : rng.int(0, out.length - 1);
    out[at] ^= 1 << rng.int(0, 7);
  }
  return { bytes: out, name: `bit-flip x${n}` };
}

function byteRun(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const out = bytes.slice();
  const at = rng.bool(0.6) ? rng.int(0, layout.headerBytes - 1) : rng.int(0, out.length - 1);
  const length = rng.bool(0.9) ? rng.int(1, 64) : rng.int(65, 4096);
  const fill = rng.pick([0x00, 0xff, 0x20, 0x30, 0x39, 0x2d, 0x14, 0x15, 0x80, -1]);
  for (let i = at; i < Math.min(out.length, at + length); i++) {
    out[i] = fill === -1 ? rng.int(0, 255) : fill;
  }
  const shown = fill === -1 ? 'random' : `0x${fill.toString(16).padStart(2, '0')}`;
  return { bytes: out, name: `byte-run ${shown} x${length} @${at}` };
}

/** Cut points at every kind of boundary of the layout, and next to it. */
function truncate(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const { headerBytes, recordBytes, recordCount, signalCount } = layout;
  const fieldEnd = (): number => {
    const [name] = rng.pick(SIGNAL_FIELDS);
    const f = signalField(name, rng.int(0, signalCount - 1), signalCount);
    return f.offset + f.width;
  };
  const [kind, at] = rng.pick<() => [string, number]>([
    () => ['empty', 0],
    () => ['one-byte', 1],
    () => ['in-fixed-header', rng.int(2, 254)],
    () => ['fixed-header-minus-1', 255],
    () => ['fixed-header', 256],
    () => ['fixed-header-plus-1', 257],
    () => ['signal-field-end', fieldEnd()],
    () => ['signal-field-end-minus-1', fieldEnd() - 1],
    () => ['header-minus-1', headerBytes - 1],
    () => ['header', headerBytes],
    () => ['header-plus-1', headerBytes + 1],
    () => [
      'signal-boundary-in-record',
      headerBytes +
        rng.int(0, recordCount - 1) * recordBytes +
        layout.signalOffsets[rng.int(0, signalCount - 1)],
    ],
    () => ['record-boundary', headerBytes + rng.int(1, Math.max(1, recordCount - 1)) * recordBytes],
    () => ['record-boundary-plus-1', headerBytes + rng.int(1, recordCount) * recordBytes + 1],
    () => ['last-byte', bytes.length - 1],
    () => [
      'odd-inside-data',
      headerBytes + 2 * rng.int(0, (bytes.length - headerBytes) / 2 - 1) + 1,
    ],
    () => {
      if (layout.annotationSignals.length === 0) return ['random', rng.int(0, bytes.length - 1)];
      const { start, end } = signalBytesIn(
        layout,
        rng.int(0, recordCount - 1),
        rng.pick(layout.annotationSignals),
      );
      return ['inside-tal', rng.int(start, end - 1)];
    },
    () => ['random', rng.int(0, bytes.length - 1)],
  ])();
  const cut = Math.max(0, Math.min(bytes.length, at));
  return { bytes: bytes.slice(0, cut), name: `truncate ${kind} @${cut}` };
}

function extend(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const last = bytes.slice(bytes.length - layout.recordBytes);
  const [kind, tail] = rng.pick<() => [string, Uint8Array]>([
    () => ['one-byte', new Uint8Array([rng.int(0, 255)])],
    () => ['record-minus-1', last.slice(0, last.length - 1)],
    () => ['copy-of-last-record', last],
    () => ['zero-record', new Uint8Array(layout.recordBytes)],
    () => ['garbage', rng.bytes(rng.int(1, 1000))],
  ])();
  return { bytes: concatBytes(bytes, tail), name: `extend ${kind} +${tail.length}` };
}

function headerField(bytes: Uint8Array, _layout: EdfLayout, rng: Rng): Mutated {
  const [name, offset, width] = rng.pick(FIXED_FIELDS);
  const value = fieldValue(rng, name, readText(bytes, offset, width));
  const spill = rng.bool(0.05);
  const out = bytes.slice();
  writeField(out, offset, width, value, spill);
  return {
    bytes: out,
    name: `header-field ${name}=${JSON.stringify(value)}${spill ? ' spill' : ''}`,
  };
}

function signalFieldMutation(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const [name] = rng.pick(SIGNAL_FIELDS);
  // Every signal at once sometimes: a reader may treat the first signal specially.
  const all = rng.bool(0.15);
  const signals = all
    ? Array.from({ length: layout.signalCount }, (_, i) => i)
    : [rng.int(0, layout.signalCount - 1)];
  const out = bytes.slice();
  let value = '';
  for (const i of signals) {
    const f = signalField(name, i, layout.signalCount);
    value = fieldValue(rng, name, readText(bytes, f.offset, f.width));
    writeField(out, f.offset, f.width, value);
  }
  const which = all ? 'all' : String(signals[0] + 1);
  return { bytes: out, name: `signal-field ${name}[${which}]=${JSON.stringify(value)}` };
}

/**
 * Signal count and header bytes changed together (so the first consistency check passes):
 * the signal headers are then read with the wrong column widths.
 */
function signalCount(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const n = Math.max(1, layout.signalCount + rng.pick([-1, 1, 2, -2, 100]));
  const out = bytes.slice();
  const count = fixedField('signalCount');
  const header = fixedField('headerBytes');
  writeField(out, count.offset, count.width, String(n));
  writeField(out, header.offset, header.width, String(256 * (1 + n)));
  return { bytes: out, name: `signal-count ${layout.signalCount}->${n} with header bytes` };
}

/**
 * One signal's samples per record (or the record duration) changed, with the record count
 * and the data cut to match the file size, so the size checks pass and the records are
 * read out of step: TALs land in sample data and sample data in TALs.
 */
function reframe(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const out = bytes.slice();
  if (rng.bool(0.25)) {
    const f = fixedField('recordDuration');
    const value = rng.pick(['0.5', '2', '0.001', '3600', '0.1', '7']);
    writeField(out, f.offset, f.width, value);
    return { bytes: out, name: `reframe recordDuration=${value}` };
  }
  const s = rng.int(0, layout.signalCount - 1);
  const spr = layout.samplesPerRecord[s];
  const next = Math.max(1, rng.pick([spr - 1, spr + 1, spr * 2, Math.floor(spr / 2), 1, spr + 7]));
  const recordBytes = layout.recordBytes + 2 * (next - spr);
  const dataBytes = bytes.length - layout.headerBytes;
  const records = Math.floor(dataBytes / recordBytes);
  const f = signalField('samplesPerRecord', s, layout.signalCount);
  writeField(out, f.offset, f.width, String(next));
  const c = fixedField('recordCount');
  writeField(out, c.offset, c.width, String(records));
  return {
    bytes: out.slice(0, layout.headerBytes + records * recordBytes),
    name: `reframe samplesPerRecord[${s + 1}] ${spr}->${next}, ${records} records`,
  };
}

function records(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  const { headerBytes, recordBytes, recordCount } = layout;
  const header = bytes.slice(0, headerBytes);
  const list: Uint8Array[] = [];
  for (let r = 0; r < recordCount; r++) {
    list.push(bytes.slice(headerBytes + r * recordBytes, headerBytes + (r + 1) * recordBytes));
  }
  const r = rng.int(0, recordCount - 1);
  const [kind, next] = rng.pick<() => [string, Uint8Array[]]>([
    () => [`drop ${r + 1}`, list.filter((_, i) => i !== r)],
    () => [`duplicate ${r + 1}`, [...list.slice(0, r + 1), list[r], ...list.slice(r + 1)]],
    () => {
      const other = rng.int(0, recordCount - 1);
      const swapped = list.slice();
      [swapped[r], swapped[other]] = [swapped[other], swapped[r]];
      return [`swap ${r + 1}<->${other + 1}`, swapped];
    },
    () => ['reverse', list.slice().reverse()],
    () => ['drop-all', []],
    () => [`zero ${r + 1}`, list.map((rec, i) => (i === r ? new Uint8Array(rec.length) : rec))],
  ])();
  // Fixing the count makes the size consistent, so the reader must judge the content.
  const fixCount = rng.bool(0.7);
  if (fixCount) {
    const c = fixedField('recordCount');
    writeField(header, c.offset, c.width, String(next.length));
  }
  return {
    bytes: concatBytes(header, ...next),
    name: `records ${kind}${fixCount ? ' (count fixed)' : ''}`,
  };
}

/** The TAL text that replaces one annotation signal's bytes in one record (Kemp & Olivan 2003). */
function talText(rng: Rng, recordStart: string, room: number): [string, string] {
  const keep = `${recordStart}\x14\x14\x00`;
  const digits = (): string => '9'.repeat(rng.int(16, Math.max(16, room - 8)));
  return rng.pick<() => [string, string]>([
    () => {
      // prettier-ignore
      const bad = rng.pick([
        '', '+', '-', '1', '++1', '+1..2', '+1.', '+.5', '+1e5', '+-1', '+ 1', '+1,5', '+0x1',
        '+\u0661', '+1\u00a0', '+Infinity', '+NaN',
      ]);
      return [`bad-onset ${JSON.stringify(bad)}`, `${bad}\x14\x14\x00`];
    },
    () => ['huge-onset', `+${digits()}\x14\x14\x00`],
    () => ['huge-negative-onset', `-${digits()}\x14\x14\x00`],
    () => ['huge-duration', `${keep}+0.5\x15${digits()}\x14x\x14\x00`],
    () => ['negative-duration', `${keep}+0.5\x15-1\x14x\x14\x00`],
    () => ['negative-timekeeping', `-${rng.int(1, 100000)}\x14\x14\x00`],
    () => {
      const shift = rng.pick(['0.5', '1', '1000000', '0.0001', '3.25']);
      return [
        `shifted-timekeeping +${shift}`,
        `+${Number(recordStart) + Number(shift)}\x14\x14\x00`,
      ];
    },
    () => ['no-timekeeping', `${recordStart}\x14stimulus\x14\x00`],
    () => ['missing-0x14-after-onset', `${recordStart}\x14\x00`],
    () => ['missing-0x14-after-text', `${keep}+0.5\x14stimulus\x00`],
    () => ['missing-0x15-value', `${keep}+0.5\x15\x14x\x14\x00`],
    () => ['missing-0x00', `${recordStart}\x14\x14+0.5\x14x\x14`],
    () => ['invalid-utf8', `${keep}+0.5\x14\u00c3\u0028\u00ff\x14\x00`],
    () => ['many-tals', keep + '+0\x14x\x14\x00'.repeat(Math.floor(room / 8))],
    () => ['empty', ''],
  ])();
}

function tal(bytes: Uint8Array, layout: EdfLayout, rng: Rng): Mutated {
  if (layout.annotationSignals.length === 0) {
    // Plain EDF: make a data signal an annotation signal, so its samples are read as TALs.
    const out = bytes.slice();
    const s = rng.int(0, layout.signalCount - 1);
    const f = signalField('label', s, layout.signalCount);
    writeField(out, f.offset, f.width, 'EDF Annotations');
    if (rng.bool()) {
      const r = fixedField('reserved');
      writeField(out, r.offset, r.width, rng.pick(['EDF+C', 'EDF+D']));
    }
    return { bytes: out, name: `tal signal ${s + 1} relabelled as annotations` };
  }
  const out = bytes.slice();
  const record = rng.int(0, layout.recordCount - 1);
  const signal = rng.bool(0.8) ? layout.annotationSignals[0] : rng.pick(layout.annotationSignals);
  const { start, end } = signalBytesIn(layout, record, signal);
  const region = out.subarray(start, end);
  let firstText = '';
  for (const b of region) {
    if (b === 0x14 || b === 0x15 || b === 0x00) break;
    firstText += String.fromCharCode(b);
  }
  const recordStart = /^[+-]\d+(\.\d+)?$/.test(firstText) ? firstText : '+0';
  const where = `record ${record + 1} signal ${signal + 1}`;
  const op = rng.int(0, 9);
  if (op < 6) {
    const [name, textValue] = talText(rng, recordStart, region.length);
    region.fill(0);
    const encoded = encodeFieldText(textValue).slice(0, region.length);
    region.set(encoded);
    return { bytes: out, name: `tal ${name} (${where})` };
  }
  if (op < 8) {
    // One delimiter removed or replaced: the TAL after it runs into the next one.
    const present = [0x14, 0x15, 0x00].filter((d) => region.includes(d));
    if (present.length === 0) return { bytes: out, name: `tal no delimiter to remove (${where})` };
    const delimiter = rng.pick(present);
    const positions: number[] = [];
    region.forEach((b, i) => {
      if (b === delimiter) positions.push(i);
    });
    const at = rng.pick(positions);
    if (rng.bool()) {
      region.copyWithin(at, at + 1);
      region[region.length - 1] = 0;
    } else {
      region[at] = rng.pick([0x20, 0x2b, 0x31, 0x14, 0x15, 0x00].filter((b) => b !== delimiter));
    }
    return {
      bytes: out,
      name: `tal delimiter 0x${delimiter.toString(16)} removed @${at} (${where})`,
    };
  }
  if (op < 9) {
    // No 0x00 anywhere: the last TAL never ends.
    const used = region.findIndex((b, i) => b === 0 && region.subarray(i).every((x) => x === 0));
    region.fill(0x78, used < 0 ? region.length - 1 : used);
    return { bytes: out, name: `tal unterminated (${where})` };
  }
  region.set(rng.bytes(region.length));
  return { bytes: out, name: `tal garbage (${where})` };
}

const SINGLE: Record<
  Exclude<EdfMutationFamily, 'stacked'>,
  (bytes: Uint8Array, layout: EdfLayout, rng: Rng) => Mutated
> = {
  'bit-flip': bitFlips,
  'byte-run': byteRun,
  truncate,
  extend,
  'header-field': headerField,
  'signal-field': signalFieldMutation,
  'signal-count': signalCount,
  reframe,
  records,
  tal,
};

/** One mutation of `family` applied to a valid file of layout `layout`. */
export function mutateEdf(
  bytes: Uint8Array,
  layout: EdfLayout,
  family: EdfMutationFamily,
  rng: Rng,
): Mutated {
  if (family !== 'stacked') return SINGLE[family](bytes, layout, rng);
  // Two to four mutations in a row: a reader that survives each alone may not survive both.
  const steps = rng.int(2, 4);
  let current: Mutated = { bytes, name: '' };
  const names: string[] = [];
  for (let i = 0; i < steps; i++) {
    const next = rng.weighted(EDF_FAMILY_WEIGHTS.filter(([f]) => f !== 'stacked')) as Exclude<
      EdfMutationFamily,
      'stacked'
    >;
    // The layout is the base file's: later steps may aim slightly off, which is fine for a fuzzer.
    if (current.bytes.length < 2) break;
    current = SINGLE[next](current.bytes, layout, rng);
    names.push(current.name);
  }
  return { bytes: current.bytes, name: `stacked [${names.join(' | ')}]` };
}
