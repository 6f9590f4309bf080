/**
 * Paths of an EEG-BIDS upload. The BIDS specification ("Common principles: File name
 * structure", bids-specification.readthedocs.io) names files `<entity>-<label>_…_<suffix>.<ext>`
 * with alphanumeric labels, in `sub-<label>/[ses-<label>/]<datatype>/`; the EEG section lists
 * `_eeg.edf` and `_eeg.bdf` as the raw data files and `_events.tsv`, `_channels.tsv`,
 * `_eeg.json` as their sidecars.
 */

/** What a file name says under the BIDS naming rules; null when it is no BIDS name. */
export interface BidsName {
  /** Entities in file order, e.g. `{ sub: '01', ses: 'base', task: 'rest' }`. */
  entities: Record<string, string>;
  suffix: string;
  /** Lower-case, with the dot: `.edf`, `.tsv`, `.json`. */
  extension: string;
  /** The name without suffix and extension (`sub-01_ses-base_task-rest`): sidecars share it. */
  stem: string;
}

/** BIDS labels are alphanumeric (Common principles: "label"). */
const ENTITY = /^([a-z]+)-([a-zA-Z0-9]+)$/;

/**
 * A path from the client (a folder's `webkitRelativePath` or a zip entry name) made safe, or
 * the reason it is refused: no absolute path, drive letter, `..` or `.` segment, no control
 * character (the "zip slip" a crafted archive tries; common practice).
 */
export function safeRelativePath(raw: string): { path: string } | { problem: string } {
  const path = raw.replace(/\\/g, '/');
  for (let i = 0; i < path.length; i++) {
    const code = path.charCodeAt(i);
    if (code < 0x20 || code === 0x7f) {
      return { problem: `path '${JSON.stringify(raw).slice(1, -1)}': a control character found` };
    }
  }
  if (path.startsWith('/') || /^[a-zA-Z]:/.test(path)) {
    return { problem: `path '${raw}': an absolute path found, a path inside the folder expected` };
  }
  const segments = path.split('/');
  if (segments.some((s) => s === '..' || s === '.')) {
    return {
      problem: `path '${raw}': a '..' or '.' segment found, a path inside the folder expected`,
    };
  }
  if (segments.some((s) => s === '')) {
    return { problem: `path '${raw}': an empty segment found, a path inside the folder expected` };
  }
  return { path };
}

/** Parses the last segment of a path as a BIDS file name. */
export function parseBidsName(path: string): BidsName | null {
  const name = path.slice(path.lastIndexOf('/') + 1);
  const dot = name.indexOf('.');
  if (dot <= 0) return null;
  const extension = name.slice(dot).toLowerCase();
  const parts = name.slice(0, dot).split('_');
  const suffix = parts.pop() ?? '';
  if (!/^[a-zA-Z0-9]+$/.test(suffix)) return null;
  const entities: Record<string, string> = {};
  for (const part of parts) {
    const match = ENTITY.exec(part);
    if (match === null || match[1] in entities) return null;
    entities[match[1]] = match[2];
  }
  if (entities.sub === undefined) return null;
  return { entities, suffix, extension, stem: parts.join('_') };
}

/**
 * The folder a recording must sit in: `…/sub-<label>/[ses-<label>/]eeg/` (Common principles:
 * "Filesystem structure"). The upload may start below the dataset (a session folder dropped
 * alone), so only the folders present are compared with the name's entities. Null when they
 * agree, else the problem.
 */
export function folderProblem(path: string, name: BidsName): string | null {
  const segments = path.split('/').slice(0, -1);
  const wrong = (what: string): string =>
    `path '${path}': ${what} (BIDS file structure: sub-${name.entities.sub}/${name.entities.ses === undefined ? '' : `ses-${name.entities.ses}/`}eeg/)`;
  if (segments.at(-1) !== 'eeg') return wrong("the file is not in an 'eeg' folder");
  for (const segment of segments) {
    const entity = /^(sub|ses)-/.exec(segment)?.[1];
    if (entity !== undefined && segment !== `${entity}-${name.entities[entity] ?? ''}`) {
      return wrong(`the folder '${segment}' disagrees with the file name`);
    }
  }
  return null;
}
