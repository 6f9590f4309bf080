/**
 * For tests and the fuzzer: where each EDF header field stands, read from the field layout
 * of Kemp et al. 1992, deliberately apart from the reader (src/signal/edf/edf-header.ts), so
 * that files built or mutated with it check the reader against the specification.
 */

/** Fixed header fields: [name, offset, width] (Kemp et al. 1992). */
export const FIXED_FIELDS = [
  ['version', 0, 8],
  ['patient', 8, 80],
  ['recording', 88, 80],
  ['startDate', 168, 8],
  ['startTime', 176, 8],
  ['headerBytes', 184, 8],
  ['reserved', 192, 44],
  ['recordCount', 236, 8],
  ['recordDuration', 244, 8],
  ['signalCount', 252, 4],
] as const;

export type FixedFieldName = (typeof FIXED_FIELDS)[number][0];

/** Per-signal fields in header order with their widths (Kemp et al. 1992). */
export const SIGNAL_FIELDS = [
  ['label', 16],
  ['transducer', 80],
  ['dimension', 8],
  ['physicalMin', 8],
  ['physicalMax', 8],
  ['digitalMin', 8],
  ['digitalMax', 8],
  ['prefiltering', 80],
  ['samplesPerRecord', 8],
  ['reserved', 32],
] as const;

export type SignalFieldName = (typeof SIGNAL_FIELDS)[number][0];

export function fixedField(name: FixedFieldName): { offset: number; width: number } {
  const entry = FIXED_FIELDS.find(([n]) => n === name);
  if (!entry) throw new Error(`unknown field ${name}`);
  return { offset: entry[1], width: entry[2] };
}

/** Offset and width of field `name` of signal `index` (0-based) in a file of `signalCount` signals. */
export function signalField(
  name: SignalFieldName,
  index: number,
  signalCount: number,
): { offset: number; width: number } {
  let offset = 256;
  for (const [n, width] of SIGNAL_FIELDS) {
    if (n === name) return { offset: offset + index * width, width };
    offset += width * signalCount;
  }
  throw new Error(`unknown field ${name}`);
}
