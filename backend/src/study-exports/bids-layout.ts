/**
 * The derivatives folder of export.zip, laid out as the EEG-BIDS standard asks (BIDS
 * specification 1.10, "Derivatives" → "Common data types and metadata" and "Common
 * principles"):
 * - `dataset_description.json` with `DatasetType: "derivative"` and `GeneratedBy`
 *   (Derivatives, "Derived dataset and pipeline description");
 * - `participants.tsv` and `sub-<label>/sub-<label>_sessions.tsv` (Modality agnostic files,
 *   "Participants file", "Sessions file"), each with a JSON sidecar describing every column
 *   (Common principles, "Tabular files": `Description`, `Units`, `Levels`);
 * - `sub-<label>/ses-<label>/eeg/sub-<label>_ses-<label>_task-<label>_desc-<label>_measures.tsv`:
 *   entities in the order sub, ses, task, (run), desc (Common principles, "Entities" and the
 *   entity table); a visit holds one current recording per kind, so no run entity is needed.
 * Labels must be alphanumeric and must not collide when case is ignored (Common principles,
 * "Entities", "Case collision intolerance"): `bidsLabels` maps codes and visit labels to such
 * labels deterministically, and participants.tsv / sessions.tsv record the mapping.
 */
import { GYRE_VERSION } from '../version';
import type {
  ExportParticipant,
  ExportRecording,
  ExportVisit,
  StudyExportModel,
} from './export-model';
import { CONDITION_COLUMNS, conditionRows } from './condition-columns';
import { measuresOf } from './measures';
import { RESULT_COLUMNS, type ExportColumn, type RowContext } from './results-columns';
import { tableText, type Cell } from './table-text';

export const BIDS_VERSION = '1.10.0';

/** One file of the folder, path relative to the dataset root. */
export interface BidsFile {
  path: string;
  content: string;
}

const ALNUM = /[^A-Za-z0-9]/g;

/**
 * Alphanumeric labels for `texts`, in their order, unique when case is ignored: each text
 * without its other characters (`AC-0042` → `AC0042`, `Month 6` → `Month6`), `fallback` when
 * nothing is left; when several texts give the same label, the first keeps it and the others
 * get `n2`, `n3`, … appended (skipping any label already taken). The same texts in the same
 * order always get the same labels.
 */
export function bidsLabels(texts: readonly string[], fallback: string): string[] {
  const bases = texts.map((t) => t.replace(ALNUM, '') || fallback);
  const taken = new Set(bases.map((b) => b.toLowerCase()));
  const given = new Set<string>();
  return bases.map((base) => {
    const key = base.toLowerCase();
    if (!given.has(key)) {
      given.add(key);
      return base;
    }
    for (let n = 2; ; n += 1) {
      const candidate = `${base}n${n}`;
      const lower = candidate.toLowerCase();
      if (!taken.has(lower) && !given.has(lower)) {
        taken.add(lower);
        given.add(lower);
        return candidate;
      }
    }
  });
}

/** The task label of a recording kind, and the `desc` label of its measures file. */
export const KIND_LABELS = {
  resting: { task: 'rest', desc: 'alphapeak' },
  task: { task: 'stimulus', desc: 'freqshift' },
} as const;

interface SidecarEntry {
  LongName?: string;
  Description: string;
  Units?: string;
  Levels?: Record<string, string>;
}

const COLUMN_BY_NAME = new Map(RESULT_COLUMNS.map((c) => [c.name, c]));

function entryOf<C>(column: ExportColumn<C>): SidecarEntry {
  return {
    Description: column.description,
    ...(column.unit === undefined ? {} : { Units: column.unit }),
    ...(column.levels === undefined ? {} : { Levels: column.levels }),
  };
}

/** The results.csv columns of these names, in this order. */
function columnsNamed(names: readonly string[]): ExportColumn[] {
  return names.map((name) => {
    const column = COLUMN_BY_NAME.get(name);
    if (column === undefined) throw new Error(`export: no column ${name}`);
    return column;
  });
}

/**
 * A TSV table and its JSON sidecar describing every column (Common principles, "Tabular
 * files"): `keys` are the leading BIDS id columns with their descriptions, then `columns`.
 */
function* tableFiles<C>(
  stem: string,
  keys: Record<string, string>,
  columns: readonly ExportColumn<C>[],
  rows: Cell[][],
): Generator<BidsFile> {
  const header = [...Object.keys(keys), ...columns.map((c) => c.name)];
  yield { path: `${stem}.tsv`, content: tableText('tsv', rows, { header }) };
  const described: Record<string, SidecarEntry> = {};
  for (const [name, description] of Object.entries(keys)) {
    described[name] = { Description: description };
  }
  for (const column of columns) described[column.name] = entryOf(column);
  yield { path: `${stem}.json`, content: `${JSON.stringify(described, null, 2)}\n` };
}

/** The BIDS id columns of participants.tsv and sessions.tsv, which record the label mapping. */
const PARTICIPANT_KEY = {
  participant_id:
    'BIDS subject: "sub-" and the participant code without its non-alphanumeric characters (see participant_code).',
};
const SESSION_KEY = {
  session_id:
    'BIDS session: "ses-" and the visit label without its non-alphanumeric characters (see visit_label).',
};
const PARTICIPANT_COLUMNS = columnsNamed([
  'participant_code',
  'site_code',
  'group',
  'enrolment_date',
]);
const SESSION_COLUMNS = columnsNamed([
  'visit_label',
  'planned_visit',
  'visit_date',
  'study_day',
  'days_from_target',
  'visit_window',
  'visit_flagged',
]);
/** The measures files carry the recording's and the row's columns of results.csv. */
export const MEASURE_COLUMNS = RESULT_COLUMNS.filter((c) => c.level !== 'visit');

function cells(columns: readonly ExportColumn[], context: RowContext): Cell[] {
  return columns.map((column) => column.value(context));
}

/** A context for visit-level columns, which read the participant and the visit only. */
function visitContext(
  studyCode: string,
  participant: ExportParticipant,
  visit: ExportVisit | null,
): RowContext {
  return { studyCode, participant, visit, recording: null, measure: null } as unknown as RowContext;
}

export function datasetDescription(model: StudyExportModel): Record<string, unknown> {
  return {
    Name: `Gyre results of study ${model.study.code}`,
    BIDSVersion: BIDS_VERSION,
    DatasetType: 'derivative',
    GeneratedBy: [
      {
        Name: 'Gyre',
        Version: GYRE_VERSION,
        Description:
          'Resting peak alpha frequency and centre of gravity, and task-related instantaneous-frequency shift (Δf), per visit; research use only.',
      },
    ],
  };
}

const README = (model: StudyExportModel): string =>
  [
    `# Gyre results of study ${model.study.code}`,
    '',
    'Research use only. Not a diagnostic device: do not use these results for clinical decisions.',
    '',
    'Derivatives computed by Gyre from the study’s EEG recordings: per visit, the numbers of the',
    'visit’s current resting and task recordings, as Gyre’s results screens show them.',
    'participants.tsv and each sub-*/sub-*_sessions.tsv map the folder labels back to the',
    'participant codes and visit labels; every table has a JSON sidecar describing its columns.',
    'conditions.tsv (when onsets carry labels) gives Δf per condition and, in its difference_*',
    'columns, the difference of the two compared conditions: a difference, not a condition.',
    'Columns whose description starts with "Doubt:" mark numbers to read with care.',
    '',
  ].join('\n');

/** The entities' labels of the export: subject per participant, session per visit. */
export interface BidsLabels {
  subject: Map<string, string>;
  session: Map<string, string>;
}

export function labelsOf(model: StudyExportModel, visits: readonly ExportVisit[]): BidsLabels {
  const withData = new Set(visits.map((v) => v.participantId));
  const participants = model.participants.filter((p) => withData.has(p.id));
  const subjectLabels = bidsLabels(
    participants.map((p) => p.code),
    'participant',
  );
  const subject = new Map(participants.map((p, i) => [p.id, subjectLabels[i]]));
  const session = new Map<string, string>();
  for (const participant of participants) {
    const own = visits.filter((v) => v.participantId === participant.id);
    const labels = bidsLabels(
      own.map((v) => v.label),
      'visit',
    );
    own.forEach((v, i) => session.set(v.id, labels[i]));
  }
  return { subject, session };
}

export function measuresFileStem(
  subject: string,
  session: string,
  recording: Pick<ExportRecording, 'kind'>,
): string {
  const kind = KIND_LABELS[recording.kind];
  return `sub-${subject}_ses-${session}_task-${kind.task}_desc-${kind.desc}_measures`;
}

/**
 * The files of the folder, one at a time (each written only when asked for), in a fixed
 * order; only participants and visits with numbers appear.
 */
export function* bidsFiles(model: StudyExportModel): Generator<BidsFile> {
  const studyCode = model.study.code;
  const visits = model.visits.filter((v) => v.recordings.length > 0);
  const labels = labelsOf(model, visits);
  yield {
    path: 'dataset_description.json',
    content: `${JSON.stringify(datasetDescription(model), null, 2)}\n`,
  };
  yield { path: 'README.md', content: README(model) };
  const participants = model.participants.filter((p) => labels.subject.has(p.id));
  yield* conditionFiles(model, labels);
  yield* tableFiles(
    'participants',
    PARTICIPANT_KEY,
    PARTICIPANT_COLUMNS,
    participants.map((p) => [
      `sub-${labels.subject.get(p.id)!}`,
      ...cells(PARTICIPANT_COLUMNS, visitContext(studyCode, p, null)),
    ]),
  );
  for (const participant of participants) {
    const sub = labels.subject.get(participant.id)!;
    const own = visits.filter((v) => v.participantId === participant.id);
    yield* tableFiles(
      `sub-${sub}/sub-${sub}_sessions`,
      SESSION_KEY,
      SESSION_COLUMNS,
      own.map((v) => [
        `ses-${labels.session.get(v.id)!}`,
        ...cells(SESSION_COLUMNS, visitContext(studyCode, participant, v)),
      ]),
    );
    for (const visit of own) {
      const ses = labels.session.get(visit.id)!;
      for (const recording of visit.recordings) {
        const stem = `sub-${sub}/ses-${ses}/eeg/${measuresFileStem(sub, ses, recording)}`;
        const rows = measuresOf(recording).map((measure) =>
          cells(MEASURE_COLUMNS, { studyCode, participant, visit, recording, measure }),
        );
        yield* tableFiles(stem, {}, MEASURE_COLUMNS, rows);
      }
    }
  }
}

/**
 * `conditions.tsv` / `.json` at the dataset root: the conditions table of conditions.csv with
 * the BIDS subject and session first; not written when no task run found any condition.
 */
function* conditionFiles(model: StudyExportModel, labels: BidsLabels): Generator<BidsFile> {
  const rows = [...conditionRows(model)].map(({ context, cells }) => [
    `sub-${labels.subject.get(context.participant.id)!}`,
    `ses-${labels.session.get(context.visit.id)!}`,
    ...cells,
  ]);
  if (rows.length === 0) return;
  yield* tableFiles(
    'conditions',
    {
      participant_id: 'BIDS subject, as in participants.tsv.',
      session_id: "BIDS session, as in the subject's sessions.tsv.",
    },
    CONDITION_COLUMNS,
    rows,
  );
}

/** Data rows of the measures files a model gives (what the audit entry counts). */
export function measureRowCount(model: StudyExportModel): number {
  let rows = 0;
  for (const visit of model.visits) {
    for (const recording of visit.recordings) rows += measuresOf(recording).length;
  }
  return rows;
}
