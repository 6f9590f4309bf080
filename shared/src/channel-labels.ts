/**
 * The one copy of Gyre's 10-10 label rules, for the signal core, the server, the seeder and
 * the client. A subpath of its own (`@gyre/shared/channel-labels`) that imports nothing: the
 * signal core loads nothing else of `@gyre/shared` at run time (signal-boundary.spec.ts), and
 * the client's lazily loaded review code takes only these few functions.
 *
 * Channel labels of the 10-10 system (ACNS Guideline 2, 2016: "Guidelines for
 * standard electrode position nomenclature"). Recording systems write the same
 * electrode as `EEG O1-REF`, `O1`, `o1-A1` or `EEG Oz`; Gyre matches them by a
 * canonical 10-10 name.
 */

/** Electrode-name prefixes of the 10-10 system (ACNS 2016, Guideline 2, Fig. 1). */
const PREFIXES_10_10 = ['Fp', 'AF', 'F', 'FT', 'FC', 'T', 'TP', 'C', 'CP', 'P', 'PO', 'O', 'I'];

/**
 * Old 10-20 names replaced by the 10-10 system: T3→T7, T4→T8, T5→P7, T6→P8
 * (ACNS 2016, Guideline 2).
 */
const RENAMED_10_20: Readonly<Record<string, string>> = { T3: 'T7', T4: 'T8', T5: 'P7', T6: 'P8' };

/**
 * Reference names that, after a '-', make a label referential rather than bipolar:
 * ears/mastoids (A1, A2, M1, M2; ACNS 2016), linked ears and average references
 * (common practice).
 */
const REFERENCE_NAMES = new Set([
  'REF',
  'A1',
  'A2',
  'M1',
  'M2',
  'A1A2',
  'M1M2',
  'LE',
  'RE',
  'AR',
  'AV',
  'AVG',
  'AVE',
  'CAR',
  'REFERENCE',
  'LINKED',
]);

/** EDF+ signal types other than EEG (Kemp & Olivan 2003, "standard texts"): not scalp EEG. */
const NON_EEG_TYPES = new Set([
  'ECG',
  'EKG',
  'EMG',
  'EOG',
  'RESP',
  'SAO2',
  'TEMP',
  'PULSE',
  'EVENT',
]);

/**
 * Canonical 10-10 spelling of one electrode name (`fpz` → `Fpz`, `POZ` → `POz`,
 * `t3` → `T7`), or null when it is not a 10-10 scalp electrode.
 * Also accepts the nasion/inion midline points `Nz` and `Iz`.
 */
export function canonicalElectrodeName(name: string): string | null {
  const m = /^([A-Za-z]{1,2})(z|Z|[1-9]|10)$/.exec(name.trim());
  if (!m) return null;
  const prefixUpper = m[1].toUpperCase();
  if (prefixUpper === 'N') return m[2].toLowerCase() === 'z' ? 'Nz' : null;
  const prefix = PREFIXES_10_10.find((p) => p.toUpperCase() === prefixUpper);
  if (!prefix) return null;
  const position = m[2].toLowerCase();
  const canonical = `${prefix}${position}`;
  return RENAMED_10_20[canonical] ?? canonical;
}

/**
 * Canonical 10-10 name of a channel label, or null when the label is not a single
 * scalp EEG electrode (another signal type, a bipolar derivation such as `P3-O1`,
 * or an unknown name).
 *
 * Accepted forms: an optional `EEG` type prefix (EDF+ label convention, Kemp & Olivan
 * 2003), the electrode, and an optional reference after '-' (`REF`, `A1`, `M2`,
 * `AVG`, ...). Case does not matter.
 */
export function normaliseChannelLabel(label: string): string | null {
  let rest = label.trim();
  const typed = /^([A-Za-z0-9]+)[\s_]+(.*)$/.exec(rest);
  if (typed) {
    const type = typed[1].toUpperCase();
    if (type === 'EEG') rest = typed[2];
    else if (NON_EEG_TYPES.has(type)) return null;
  } else if (/^EEG-/i.test(rest)) {
    rest = rest.slice(4);
  }
  const parts = rest.split('-').map((p) => p.trim());
  if (parts.length > 2 || parts.some((p) => p.length === 0)) return null;
  const electrode = canonicalElectrodeName(parts[0]);
  if (!electrode) return null;
  if (parts.length === 2 && !REFERENCE_NAMES.has(parts[1].toUpperCase().replace(/\s+/g, ''))) {
    return null;
  }
  return electrode;
}
