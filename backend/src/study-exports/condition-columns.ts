import type { ConditionDifferenceView, ConditionStatsView } from '@gyre/shared';
import type { ExportRecording, StudyExportModel } from './export-model';
import { RESULT_COLUMNS, type ExportColumn, type RowContext } from './results-columns';
import type { Cell } from './table-text';

/** What one row of the conditions table is about: one condition of one task recording. */
export interface ConditionRowContext extends Omit<RowContext, 'measure'> {
  condition: ConditionStatsView;
  /** The recording's difference of two conditions, repeated on each of its rows. */
  difference: ConditionDifferenceView | null;
}

/** results.csv's column of that name, reading the visit and the recording only. */
function sharedColumn(name: string): ExportColumn<ConditionRowContext> {
  const column = RESULT_COLUMNS.find((c) => c.name === name);
  if (column === undefined) throw new Error(`export: no column ${name}`);
  // These columns read the participant, the visit and the recording, never the measure row.
  return {
    ...column,
    value: (r) => column.value({ ...r, measure: null } as unknown as RowContext),
  };
}

const hz = (
  name: string,
  description: string,
  value: (r: ConditionRowContext) => number | null,
): ExportColumn<ConditionRowContext> => ({
  name,
  level: 'measure',
  type: 'number',
  unit: 'Hz',
  description,
  value,
});

/**
 * The conditions table (conditions.csv, and conditions.tsv in export.zip): long format, one
 * row per visit × task recording × condition, the difference of the compared pair in columns
 * repeated on each row of the recording (so a reader filters, never joins, to get it).
 */
export const CONDITION_COLUMNS: readonly ExportColumn<ConditionRowContext>[] = [
  ...[
    'study_code',
    'site_code',
    'participant_code',
    'group',
    'visit_label',
    'visit_date',
    'recording_id',
    'run_id',
    'settings_version',
  ].map(sharedColumn),
  {
    name: 'condition',
    level: 'measure',
    type: 'text',
    description: 'The condition: an onset label (EDF+ annotation text or the onset CSV label).',
    freeText: true,
    value: (r) => r.condition.label,
  },
  {
    name: 'trials_kept',
    level: 'measure',
    type: 'integer',
    description: 'Trials of the condition kept (a count).',
    value: (r) => r.condition.trialsKept,
  },
  {
    name: 'trials_total',
    level: 'measure',
    type: 'integer',
    description: 'Trials of the condition before rejection (a count).',
    value: (r) => r.condition.trialsTotal,
  },
  hz(
    'baseline_f',
    'Mean instantaneous frequency before onset, region of interest.',
    (r) => r.condition.baselineHz,
  ),
  hz(
    'post_f',
    'Mean instantaneous frequency after onset, region of interest.',
    (r) => r.condition.postHz,
  ),
  hz(
    'delta_f',
    "The condition's Δf: mean over its kept trials of post − baseline; negative = slowing.",
    (r) => r.condition.deltaFHz,
  ),
  hz(
    'ci_low',
    'Lower end of the bootstrap 95 % interval of the mean Δf over the condition’s trials.',
    (r) => r.condition.ciHz?.[0] ?? null,
  ),
  hz(
    'ci_high',
    'Upper end of the bootstrap 95 % interval of the mean Δf over the condition’s trials.',
    (r) => r.condition.ciHz?.[1] ?? null,
  ),
  {
    name: 'p_value',
    level: 'measure',
    type: 'number',
    description:
      "Two-sided Wilcoxon signed-rank p of the condition's trial Δf values (a probability).",
    value: (r) => r.condition.pValue,
  },
  {
    name: 'difference_first',
    level: 'recording',
    type: 'text',
    description:
      'The difference is Δf(difference_first) − Δf(difference_second); empty with fewer than two conditions.',
    freeText: true,
    value: (r) => r.difference?.first ?? null,
  },
  {
    name: 'difference_second',
    level: 'recording',
    type: 'text',
    description: 'The condition subtracted in the difference.',
    freeText: true,
    value: (r) => r.difference?.second ?? null,
  },
  {
    name: 'difference_chosen_by',
    level: 'recording',
    type: 'text',
    description: 'How the pair was chosen.',
    levels: {
      settings: "named in the study's analysis settings",
      request: 'named for the computation',
      'first-two': 'the first two conditions found in the onsets',
    },
    value: (r) => r.difference?.chosenBy ?? null,
  },
  hz(
    'difference_delta_f',
    'A difference, not a condition: mean Δf of the first minus mean Δf of the second.',
    (r) => r.difference?.differenceHz ?? null,
  ),
  hz(
    'difference_ci_low',
    'Lower end of the bootstrap 95 % interval of the difference (trials resampled within each condition).',
    (r) => r.difference?.ciHz?.[0] ?? null,
  ),
  hz(
    'difference_ci_high',
    'Upper end of the bootstrap 95 % interval of the difference.',
    (r) => r.difference?.ciHz?.[1] ?? null,
  ),
  {
    name: 'difference_p_value',
    level: 'recording',
    type: 'number',
    description:
      'Two-sided permutation-test p of the difference of means (condition labels shuffled).',
    value: (r) => r.difference?.pValue ?? null,
  },
  {
    name: 'difference_permutations',
    level: 'recording',
    type: 'integer',
    description: 'Label shuffles of the permutation test (a count).',
    value: (r) => r.difference?.permutations ?? null,
  },
  {
    name: 'difference_seed',
    level: 'recording',
    type: 'integer',
    description: "Seed of the permutation test's fixed random sequence.",
    value: (r) => r.difference?.seed ?? null,
  },
];

export const CONDITION_HEADER = CONDITION_COLUMNS.map((c) => c.name);

export const CONDITION_FREE_TEXT = new Set(
  CONDITION_COLUMNS.flatMap((c, i) => (c.freeText === true ? [i] : [])),
);

/** The rows' contexts of one recording: one per condition, in the order they were found. */
export function conditionContexts(
  base: Omit<RowContext, 'measure' | 'recording'>,
  recording: ExportRecording,
): ConditionRowContext[] {
  const depth = recording.depth;
  if (depth === null) return [];
  return depth.conditions.map((condition) => ({
    ...base,
    recording,
    condition,
    difference: depth.conditionDifference,
  }));
}

/** Every condition row of the study, in the model's order (participant, visit, recording). */
export function* conditionRows(
  model: StudyExportModel,
): Generator<{ context: ConditionRowContext; cells: Cell[] }> {
  const participants = new Map(model.participants.map((p) => [p.id, p]));
  for (const visit of model.visits) {
    const participant = participants.get(visit.participantId)!;
    for (const recording of visit.recordings) {
      for (const context of conditionContexts(
        { studyCode: model.study.code, participant, visit },
        recording,
      )) {
        yield { context, cells: CONDITION_COLUMNS.map((c) => c.value(context)) };
      }
    }
  }
}
