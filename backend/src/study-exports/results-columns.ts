import { VISIT_WINDOWS } from '@gyre/shared';
import type { ExportParticipant, ExportRecording, ExportVisit } from './export-model';
import { MEASURES, type MeasureRow } from './measures';
import type { Cell } from './table-text';

/** What one row of the results CSV is about. */
export interface RowContext {
  studyCode: string;
  participant: ExportParticipant;
  visit: ExportVisit;
  recording: ExportRecording;
  measure: MeasureRow;
}

/**
 * `visit`: the same on every row of a visit (participants.tsv / sessions.tsv in the zip);
 * `recording`: the same on every row of a recording; `measure`: the row's own.
 */
export type ColumnLevel = 'visit' | 'recording' | 'measure';

export interface ExportColumn<Context = RowContext> {
  name: string;
  level: ColumnLevel;
  type: 'text' | 'number' | 'integer' | 'boolean' | 'date' | 'datetime';
  /** SI unit of a quantity (BIDS sidecar `Units`); absent for text, counts and probabilities. */
  unit?: string;
  description: string;
  /** Every value a categorical column can take, with its meaning (BIDS sidecar `Levels`). */
  levels?: Record<string, string>;
  /** Text a person typed: the CSV guards it against spreadsheet formulas. */
  freeText?: boolean;
  value: (row: Context) => Cell;
}

const joined = (items: readonly string[]): string | null =>
  items.length === 0 ? null : items.join('; ');

const BAND_SOURCES = {
  settings: "the study's settings (or the visit's override) named the band",
  iaf: "the visit's resting IAF ± 2 Hz",
  default: '8–13 Hz, because no resting IAF was known (see missing_resting_iaf)',
};

/**
 * Every column of results.csv, in order, with its dictionary entry: the data dictionary
 * (`results-dictionary.csv`), the BIDS sidecars and docs/exports.md describe these.
 */
export const RESULT_COLUMNS: readonly ExportColumn[] = [
  {
    name: 'study_code',
    level: 'visit',
    type: 'text',
    description: "The study's code.",
    value: (r) => r.studyCode,
  },
  {
    name: 'site_code',
    level: 'visit',
    type: 'text',
    description: "The code of the participant's site.",
    value: (r) => r.participant.siteCode,
  },
  {
    name: 'participant_code',
    level: 'visit',
    type: 'text',
    description: 'The pseudonymous participant code (never a name or anything from a file header).',
    value: (r) => r.participant.code,
  },
  {
    name: 'group',
    level: 'visit',
    type: 'text',
    description: "The participant's group (arm) in the study; empty when none was set.",
    freeText: true,
    value: (r) => r.participant.group,
  },
  {
    name: 'enrolment_date',
    level: 'visit',
    type: 'date',
    description: 'Enrolment date (YYYY-MM-DD), day 0 of the visit schedule; empty when not set.',
    value: (r) => r.participant.enrolmentDate,
  },
  {
    name: 'visit_label',
    level: 'visit',
    type: 'text',
    description: "The visit's label as registered (the planned visit's name when one was picked).",
    freeText: true,
    value: (r) => r.visit.label,
  },
  {
    name: 'planned_visit',
    level: 'visit',
    type: 'text',
    description:
      "The name of the schedule's planned visit the visit was registered on; empty for an unscheduled visit.",
    freeText: true,
    value: (r) => r.visit.schedule.plannedVisit,
  },
  {
    name: 'visit_date',
    level: 'visit',
    type: 'date',
    description: 'Visit date (YYYY-MM-DD).',
    value: (r) => r.visit.visitDate,
  },
  {
    name: 'study_day',
    level: 'visit',
    type: 'integer',
    unit: 'd',
    description:
      'Days from enrolment to the visit (enrolment = day 0); empty without an enrolment date.',
    value: (r) => r.visit.schedule.studyDay,
  },
  {
    name: 'days_from_target',
    level: 'visit',
    type: 'integer',
    unit: 'd',
    description: "Study day minus the planned visit's target day; empty when either is unknown.",
    value: (r) => r.visit.schedule.daysFromTarget,
  },
  {
    name: 'visit_window',
    level: 'visit',
    type: 'text',
    description: "Where the visit falls against its planned visit's window.",
    levels: Object.fromEntries(
      VISIT_WINDOWS.map((w) => [
        w,
        {
          in: 'inside the window',
          early: 'before the window',
          late: 'after the window',
          unplanned: 'no planned visit',
          unknown: 'no enrolment date',
        }[w],
      ]),
    ),
    value: (r) => r.visit.schedule.window,
  },
  {
    name: 'visit_flagged',
    level: 'visit',
    type: 'boolean',
    description: "An analyst's slowing flag is raised on the visit (a judgement recorded in Gyre).",
    value: (r) => r.visit.flagged,
  },
  {
    name: 'recording_id',
    level: 'recording',
    type: 'text',
    description:
      "Gyre's id of the recording the numbers come from (the visit's current recording of its kind).",
    value: (r) => r.recording.recordingId,
  },
  {
    name: 'recording_kind',
    level: 'recording',
    type: 'text',
    description: 'The kind of recording.',
    levels: {
      resting: 'resting recording (PAF, CoG)',
      task: 'task recording with stimulus onsets (Δf)',
    },
    value: (r) => r.recording.kind,
  },
  {
    name: 'recording_state',
    level: 'recording',
    type: 'text',
    description:
      "The recording's state at export. Anything but `ready` means the numbers are those of its last run and a new computation is pending or failed.",
    levels: {
      ready: 'results are current',
      queued: 'waiting to be computed again',
      computing: 'being computed again',
      failed: 'the last computation failed; these are the previous numbers',
    },
    value: (r) => r.recording.state,
  },
  {
    name: 'run_id',
    level: 'recording',
    type: 'text',
    description: 'The analysis run behind the numbers (the results API gives the same run).',
    value: (r) => r.recording.run.id,
  },
  {
    name: 'run_created_at',
    level: 'recording',
    type: 'datetime',
    description: 'When the run was stored (ISO 8601, UTC).',
    value: (r) => r.recording.run.createdAt,
  },
  {
    name: 'run_trigger',
    level: 'recording',
    type: 'text',
    description: 'What started the run.',
    levels: {
      upload: 'the upload',
      rerun: "an analyst's re-run",
      retry: 'a retry after a failure',
      'rest-changed': "the visit's resting IAF appeared or changed",
      override: "the visit's analysis override changed",
      replacement: 'a replacing recording',
    },
    value: (r) => r.recording.run.trigger,
  },
  {
    name: 'settings_version',
    level: 'recording',
    type: 'integer',
    description: "The study's analysis settings version the run used.",
    value: (r) => r.recording.run.settingsVersion,
  },
  {
    name: 'code_version',
    level: 'recording',
    type: 'text',
    description: "Gyre's version that computed the run.",
    value: (r) => r.recording.run.codeVersion,
  },
  {
    name: 'input_sha256',
    level: 'recording',
    type: 'text',
    description: 'SHA-256 (hex) of the EDF file the run read.',
    value: (r) => r.recording.run.inputChecksumSha256,
  },
  {
    name: 'measure',
    level: 'measure',
    type: 'text',
    description: 'What `value` is.',
    levels: { ...MEASURES },
    value: (r) => r.measure.measure,
  },
  {
    name: 'scope',
    level: 'measure',
    type: 'text',
    description: 'Whether the row is the region of interest’s or one channel’s.',
    levels: { roi: 'the region of interest (its used channels together)', channel: 'one channel' },
    value: (r) => r.measure.scope,
  },
  {
    name: 'channel',
    level: 'measure',
    type: 'text',
    description: "The file's channel label (channel rows); empty for the region of interest.",
    value: (r) => r.measure.channel,
  },
  {
    name: 'channel_canonical',
    level: 'measure',
    type: 'text',
    description: 'The 10-10 electrode name Gyre read from the label; empty when none.',
    value: (r) => r.measure.channelCanonical,
  },
  {
    name: 'value',
    level: 'measure',
    type: 'number',
    unit: 'Hz',
    description:
      'The measured value, full precision as the results API gives it; empty when there is none (see the doubt columns).',
    value: (r) => r.measure.value,
  },
  {
    name: 'unit',
    level: 'measure',
    type: 'text',
    description: 'Unit of value, ci_low and ci_high.',
    levels: { Hz: 'hertz' },
    value: () => 'Hz',
  },
  {
    name: 'ci_low',
    level: 'measure',
    type: 'number',
    unit: 'Hz',
    description: 'Lower end of the 95 % confidence interval of Δf (delta_f rows).',
    value: (r) => r.measure.ciLow,
  },
  {
    name: 'ci_high',
    level: 'measure',
    type: 'number',
    unit: 'Hz',
    description: 'Upper end of the 95 % confidence interval of Δf (delta_f rows).',
    value: (r) => r.measure.ciHigh,
  },
  {
    name: 'p_value',
    level: 'measure',
    type: 'number',
    description: 'p of Δf against zero over trials (delta_f rows; a probability, no unit).',
    value: (r) => r.measure.pValue,
  },
  {
    name: 'trials_kept',
    level: 'measure',
    type: 'integer',
    description: 'Trials (epochs) kept for the value (task rows; a count).',
    value: (r) => r.measure.trialsKept,
  },
  {
    name: 'trials_total',
    level: 'measure',
    type: 'integer',
    description: 'Trials before rejection (region-of-interest delta_f rows; a count).',
    value: (r) => r.measure.trialsTotal,
  },
  {
    name: 'band_low_hz',
    level: 'recording',
    type: 'number',
    unit: 'Hz',
    description: 'Lower edge of the band the run analysed.',
    value: (r) => r.recording.run.bandHz[0],
  },
  {
    name: 'band_high_hz',
    level: 'recording',
    type: 'number',
    unit: 'Hz',
    description: 'Upper edge of the band the run analysed.',
    value: (r) => r.recording.run.bandHz[1],
  },
  {
    name: 'band_source',
    level: 'recording',
    type: 'text',
    description: "Where the run's band came from.",
    levels: BAND_SOURCES,
    value: (r) => r.recording.run.bandSource,
  },
  {
    name: 'missing_resting_iaf',
    level: 'recording',
    type: 'boolean',
    description:
      'Doubt: a task run fell back to 8–13 Hz because the visit had no resting IAF; empty for resting recordings.',
    value: (r) => (r.recording.kind === 'task' ? r.recording.run.bandSource === 'default' : null),
  },
  {
    name: 'no_peak_reason',
    level: 'recording',
    type: 'text',
    description: 'Doubt: why no PAF was reported (resting recordings), e.g. below-prominence.',
    value: (r) => r.recording.rest?.noPeakReason ?? null,
  },
  {
    name: 'alpha_peak_prominence_db',
    level: 'recording',
    type: 'number',
    unit: 'dB',
    description:
      'Height of the alpha peak over the 1/f background (resting recordings); empty without a clear peak.',
    value: (r) => r.recording.rest?.prominenceDb ?? null,
  },
  {
    name: 'roi_status',
    level: 'recording',
    type: 'text',
    description: 'Doubt: which region-of-interest channels the numbers come from.',
    levels: {
      complete: 'every wanted channel',
      partial: 'some channels left out (see roi_channels_left_out)',
      none: 'no channel remained: no region-of-interest value',
    },
    value: (r) => r.recording.run.roiUsage.status,
  },
  {
    name: 'roi_channels_used',
    level: 'recording',
    type: 'text',
    description: 'Region-of-interest channels the numbers come from, separated by "; ".',
    value: (r) => joined(r.recording.run.roiUsage.used),
  },
  {
    name: 'roi_channels_left_out',
    level: 'recording',
    type: 'text',
    description:
      'Doubt: region-of-interest channels left out, each with why (missing, flat, saturated, sample-rate, excluded), separated by "; ".',
    value: (r) => joined(r.recording.run.roiUsage.leftOut.map((o) => `${o.label} (${o.reason})`)),
  },
  {
    name: 'channel_in_roi',
    level: 'measure',
    type: 'boolean',
    description: 'The channel belongs to the region of interest (channel rows).',
    value: (r) => r.measure.channelInRoi,
  },
  {
    name: 'channel_flat',
    level: 'measure',
    type: 'boolean',
    description: 'Doubt: the quality checks found the channel flat (channel rows).',
    value: (r) => r.measure.channelFlat,
  },
  {
    name: 'channel_saturated',
    level: 'measure',
    type: 'boolean',
    description:
      "Doubt: the quality checks found the channel at the converter's rail (channel rows).",
    value: (r) => r.measure.channelSaturated,
  },
  {
    name: 'stale_settings',
    level: 'recording',
    type: 'text',
    description:
      'Doubt: what the study\'s current settings would compute differently from this run, separated by "; "; empty when nothing would change.',
    value: (r) => joined(r.recording.run.staleSettings),
  },
  {
    name: 'quality_warnings',
    level: 'recording',
    type: 'text',
    description: 'Doubt: the quality checks\' warnings for the recording, separated by "; ".',
    value: (r) => joined(r.recording.quality.warnings),
  },
  {
    name: 'suggests_slowing',
    level: 'recording',
    type: 'boolean',
    description:
      "The computation's slowing suggestion for a task run (Δf at or below the study's threshold with a CI excluding 0); a research marker, not a finding.",
    value: (r) => r.recording.run.suggestsSlowing,
  },
  {
    name: 'gated_share',
    level: 'measure',
    type: 'number',
    description:
      "Share (0–1) of the instantaneous-frequency samples the amplitude gate left out: the channel's (channel rows) or over the region's used channels (region-of-interest delta_f row); empty with the gate off.",
    value: (r) => r.measure.gatedShare,
  },
  {
    name: 'amplitude_gate_percentile',
    level: 'recording',
    type: 'number',
    description:
      "Setting of the run: samples under this percentile of each channel's alpha envelope were left out before the median and the epoch means; empty = gate off.",
    value: (r) => r.recording.run.depthSettings.amplitudeGatePercentile,
  },
  {
    name: 'cycle_disagreement_hz',
    level: 'recording',
    type: 'number',
    unit: 'Hz',
    description:
      'Task runs: |Δf cycle-by-cycle − Δf phase-based| of the region of interest; empty when either is missing or the cross-check was not computed.',
    value: (r) => r.recording.depth?.cycles?.disagreementHz ?? null,
  },
  {
    name: 'cycles_disagree',
    level: 'recording',
    type: 'boolean',
    description:
      'Doubt: the cycle-by-cycle and the phase-based Δf differ by more than cycle_disagreement_threshold_hz (task runs with the cross-check).',
    value: (r) => r.recording.depth?.cycles?.disagrees ?? null,
  },
  {
    name: 'cycle_disagreement_threshold_hz',
    level: 'recording',
    type: 'number',
    unit: 'Hz',
    description: 'Setting of the run: the two Δf estimates disagree above this difference.',
    value: (r) => r.recording.run.depthSettings.cycleDisagreementHz,
  },
  {
    name: 'compare_conditions',
    level: 'recording',
    type: 'text',
    description:
      'Setting of the run: the two conditions (onset labels) whose Δf difference is reported, separated by "; "; empty = the first two found (see conditions.csv).',
    freeText: true,
    value: (r) => {
      const pair = r.recording.run.depthSettings.compareConditions;
      return pair === null ? null : pair.join('; ');
    },
  },
];

export const RESULT_HEADER = RESULT_COLUMNS.map((c) => c.name);

/** Indices of the free-text columns (the CSV's spreadsheet guard). */
export const RESULT_FREE_TEXT = new Set(
  RESULT_COLUMNS.flatMap((c, i) => (c.freeText === true ? [i] : [])),
);

export const DICTIONARY_HEADER = ['column', 'level', 'type', 'unit', 'description', 'levels'];

/** The data dictionary's rows: one per column of results.csv, in order. */
export function dictionaryRows(): Cell[][] {
  return RESULT_COLUMNS.map((c) => [
    c.name,
    c.level,
    c.type,
    c.unit ?? null,
    c.description,
    c.levels === undefined
      ? null
      : Object.entries(c.levels)
          .map(([k, v]) => `${k}: ${v}`)
          .join(' | '),
  ]);
}
