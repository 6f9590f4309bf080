/**
 * 10-10 electrode names (ACNS Guideline 2, 2016, "Guidelines for standard electrode position
 * nomenclature"): the visit override names channels this way, while files label them
 * `EEG O1-REF`, `o1-A1` or `EEG Oz`. The server reads labels by the same rules.
 */

/** Electrode-name prefixes of the 10-10 system (ACNS 2016, Guideline 2, Fig. 1). */
const PREFIXES_10_10 = ['Fp', 'AF', 'F', 'FT', 'FC', 'T', 'TP', 'C', 'CP', 'P', 'PO', 'O', 'I'];

/** Old 10-20 names replaced by the 10-10 system (ACNS 2016, Guideline 2). */
const RENAMED_10_20: Readonly<Record<string, string>> = { T3: 'T7', T4: 'T8', T5: 'P7', T6: 'P8' };

/** References that, after a '-', make a label referential rather than bipolar (common practice). */
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

/** EDF+ signal types other than EEG (Kemp & Olivan 2003, "standard texts"). */
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

/** The canonical spelling of one electrode name (`fpz` → `Fpz`, `t3` → `T7`), or null. */
export function canonicalElectrodeName(name: string): string | null {
  const match = /^([A-Za-z]{1,2})(z|Z|[1-9]|10)$/.exec(name.trim());
  if (!match) return null;
  const prefixUpper = match[1].toUpperCase();
  if (prefixUpper === 'N') return match[2].toLowerCase() === 'z' ? 'Nz' : null;
  const prefix = PREFIXES_10_10.find((p) => p.toUpperCase() === prefixUpper);
  if (!prefix) return null;
  const canonical = `${prefix}${match[2].toLowerCase()}`;
  return RENAMED_10_20[canonical] ?? canonical;
}

/** The 10-10 name of a file's channel label, or null for another signal or a bipolar pair. */
export function canonicalChannelName(label: string): string | null {
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

export interface ChannelOption {
  /** The 10-10 name sent to the server. */
  value: string;
  /** The name and, when the file spells it otherwise, the file's label. */
  label: string;
}

/** The scalp electrodes among a file's labels, each once, in file order. */
export function channelOptionsOf(labels: readonly string[]): ChannelOption[] {
  const options: ChannelOption[] = [];
  for (const label of labels) {
    const name = canonicalChannelName(label);
    if (name === null || options.some((o) => o.value === name)) continue;
    options.push({
      value: name,
      label: name === label.trim() ? name : `${name} (${label.trim()})`,
    });
  }
  return options;
}
