import { parse } from 'csv-parse/sync';
import type { BidsBadChannel } from '@gyre/shared';
import { errorMessage } from '../common/errors/error-message';

/**
 * The sidecar files of an EEG-BIDS recording, read as the BIDS specification describes them
 * (bids-specification.readthedocs.io, "Electroencephalography" and "Common principles").
 * Each reader returns its values or throws a `SidecarError` naming the file, line and column.
 */
export class SidecarError extends Error {}

/** BIDS writes a missing value as `n/a` (Common principles: "Tabular files"). */
const NA = 'n/a';

/**
 * A BIDS TSV: tab-separated, first row the column names, UTF-8 (Common principles: "Tabular
 * files"), read with csv-parse. Returns the header and rows as records of column → cell.
 */
export function readTsv(
  bytes: Buffer,
  file: string,
): { header: string[]; rows: Array<{ line: number; cells: Record<string, string> }> } {
  let records: string[][];
  try {
    records = parse(bytes, {
      delimiter: '\t',
      bom: true,
      quote: false,
      skip_empty_lines: true,
      relax_column_count: false,
    }) as string[][];
  } catch (error) {
    throw new SidecarError(
      `${file}: ${errorMessage(error)}; a tab-separated file with one header row expected (BIDS tabular files)`,
    );
  }
  if (records.length === 0)
    throw new SidecarError(`${file}: an empty file found, a header row expected`);
  const header = records[0].map((name) => name.trim());
  return {
    header,
    rows: records.slice(1).map((fields, index) => ({
      line: index + 2,
      cells: Object.fromEntries(header.map((name, i) => [name, (fields[i] ?? '').trim()])),
    })),
  };
}

/** What `*_events.tsv` gives the import: an onset CSV (`onset_s,label,duration_s`) and counts. */
export interface EventsOnsets {
  /** The onsets as Gyre's onset CSV, checked by the validation lane like an uploaded one. */
  onsetsCsv: string;
  count: number;
  conditions: string[];
}

/**
 * `*_events.tsv` (EEG section, "Task events"; Common principles "Task events"): `onset` and
 * `duration` REQUIRED, seconds from the first data point; `trial_type` OPTIONAL, the event's
 * condition. Each row becomes a stimulus onset labelled with its `trial_type`; a row without
 * one (`n/a` or no column) takes `fallbackLabel` (the task label; common practice).
 */
export function eventsToOnsets(bytes: Buffer, file: string, fallbackLabel: string): EventsOnsets {
  const { header, rows } = readTsv(bytes, file);
  for (const column of ['onset', 'duration']) {
    if (!header.includes(column)) {
      throw new SidecarError(
        `${file}: no '${column}' column found (columns: ${header.join(', ')}); the BIDS events file requires onset and duration`,
      );
    }
  }
  const lines = ['onset_s,label,duration_s'];
  const conditions = new Set<string>();
  for (const { line, cells } of rows) {
    const onset = Number(cells.onset);
    if (cells.onset === '' || cells.onset === NA || !Number.isFinite(onset)) {
      throw new SidecarError(
        `${file}: line ${line}, column onset: '${cells.onset}' found, a number of seconds expected`,
      );
    }
    const duration = cells.duration === NA || cells.duration === '' ? '' : cells.duration;
    if (duration !== '' && !(Number(duration) >= 0)) {
      throw new SidecarError(
        `${file}: line ${line}, column duration: '${cells.duration}' found, seconds ≥ 0 or n/a expected`,
      );
    }
    const type = cells.trial_type ?? '';
    const label = type === '' || type === NA ? fallbackLabel : type;
    conditions.add(label);
    lines.push(`${cells.onset},${csvField(label)},${duration}`);
  }
  return { onsetsCsv: `${lines.join('\n')}\n`, count: rows.length, conditions: [...conditions] };
}

/**
 * `*_channels.tsv` (EEG section, "Channels description"): `name` REQUIRED; `status` OPTIONAL,
 * `good` or `bad`; `status_description` OPTIONAL, free text on why. The channels marked bad.
 */
export function badChannels(bytes: Buffer, file: string): BidsBadChannel[] {
  const { header, rows } = readTsv(bytes, file);
  if (!header.includes('name')) {
    throw new SidecarError(
      `${file}: no 'name' column found (columns: ${header.join(', ')}); the BIDS channels file requires name`,
    );
  }
  const bad: BidsBadChannel[] = [];
  for (const { line, cells } of rows) {
    const status = (cells.status ?? NA).toLowerCase();
    if (!['good', 'bad', NA, ''].includes(status)) {
      throw new SidecarError(
        `${file}: line ${line}, column status: '${cells.status}' found, good, bad or n/a expected`,
      );
    }
    if (status !== 'bad') continue;
    const reason = cells.status_description ?? '';
    bad.push({ label: cells.name, reason: reason === '' || reason === NA ? null : reason });
  }
  return bad;
}

/** What `*_eeg.json` gives the import. */
export interface EegSidecar {
  taskName: string | null;
  lineFrequencyHz: 50 | 60 | null;
}

/**
 * `*_eeg.json` (EEG section, "Sidecar JSON"): `TaskName` REQUIRED; `PowerLineFrequency`
 * REQUIRED, a number in Hz or `"n/a"`. Gyre's line-noise check knows 50 and 60 Hz, the two
 * mains frequencies in use (IEC 60038); another value is refused by name.
 */
export function readEegSidecar(bytes: Buffer, file: string): EegSidecar {
  let json: unknown;
  try {
    json = JSON.parse(bytes.toString('utf8'));
  } catch (error) {
    throw new SidecarError(`${file}: ${errorMessage(error)}; a JSON object expected`);
  }
  if (json === null || typeof json !== 'object' || Array.isArray(json)) {
    throw new SidecarError(`${file}: a JSON ${typeof json} found, a JSON object expected`);
  }
  const { TaskName, PowerLineFrequency } = json as Record<string, unknown>;
  let lineFrequencyHz: 50 | 60 | null = null;
  if (PowerLineFrequency === 50 || PowerLineFrequency === 60) lineFrequencyHz = PowerLineFrequency;
  else if (PowerLineFrequency !== undefined && PowerLineFrequency !== NA) {
    throw new SidecarError(
      `${file}: PowerLineFrequency ${JSON.stringify(PowerLineFrequency)} found, 50, 60 or "n/a" expected`,
    );
  }
  return {
    taskName: typeof TaskName === 'string' && TaskName.trim() !== '' ? TaskName.trim() : null,
    lineFrequencyHz,
  };
}

/**
 * The acquisition date of each file a `*_scans.tsv` lists (Common principles, "Scans file":
 * `filename` REQUIRED, relative to the session folder; `acq_time` OPTIONAL, ISO 8601
 * date-time). Keyed by the file's last path segment; only the date part is kept.
 */
export function scanDates(bytes: Buffer, file: string): Map<string, string> {
  const { header, rows } = readTsv(bytes, file);
  const dates = new Map<string, string>();
  if (!header.includes('filename') || !header.includes('acq_time')) return dates;
  for (const { cells } of rows) {
    const date = /^(\d{4}-\d{2}-\d{2})/.exec(cells.acq_time)?.[1];
    if (date !== undefined)
      dates.set(cells.filename.slice(cells.filename.lastIndexOf('/') + 1), date);
  }
  return dates;
}

/**
 * The kind a BIDS task suggests: resting when the `task-` label or `TaskName` speaks of rest
 * (`task-rest`, "resting state", "eyes closed rest"; common practice in EEG-BIDS datasets),
 * else task.
 */
export function kindOfTask(taskLabel: string, taskName: string | null): 'resting' | 'task' {
  return [taskLabel, taskName ?? ''].some((text) => /rest/i.test(text)) ? 'resting' : 'task';
}

/** RFC 4180: a field with a comma, quote or line break is quoted, quotes doubled. */
function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
