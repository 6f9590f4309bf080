/**
 * EEG-BIDS import: a BIDS session folder or zip (`sub-<label>/ses-<label>/eeg/`) dropped on
 * Intake (`POST /api/studies/:studyId/bids-imports`). The server answers a preview (dry run)
 * of every recording it found; confirming imports every one of them or none.
 */
import type { RecordingKind } from './recordings';

/** A channel the file's `*_channels.tsv` marks `bad`, with its `status_description`. */
export interface BidsBadChannel {
  label: string;
  /** The `status_description` cell, or null when empty or `n/a`. */
  reason: string | null;
}

/** One `*_eeg.edf` / `*_eeg.bdf` of the upload, as the import maps and checks it. */
export interface BidsImportFilePreview {
  /** The path inside the folder or zip, as uploaded (e.g. `sub-01/ses-base/eeg/…_eeg.edf`). */
  path: string;
  /** The `sub-` label and the participant code it maps to (null when none does). */
  subject: string;
  participantCode: string | null;
  /** Whether the participant exists or the import creates it. */
  participant: 'existing' | 'new' | null;
  /** The `ses-` label (null when the path has none) and the planned visit it maps to. */
  session: string | null;
  plannedVisit: string | null;
  visit: 'existing' | 'new' | null;
  visitDate: string | null;
  /** The `task-` entity and the `TaskName` of `*_eeg.json`. */
  task: string;
  taskName: string | null;
  /** resting when the task looks like rest (task-rest, TaskName "resting state"), else task. */
  kind: RecordingKind;
  /** Rows of `*_events.tsv` that become stimulus onsets; null without an events file. */
  onsetCount: number | null;
  /** Distinct `trial_type` values of those onsets (their condition labels). */
  conditions: string[];
  channelsLeftOut: BidsBadChannel[];
  /** `PowerLineFrequency` of `*_eeg.json` (Hz), or null when absent or `n/a`. */
  lineFrequencyHz: 50 | 60 | null;
  /** Why this file cannot be imported; any problem stops the whole import. */
  problems: string[];
  warnings: string[];
  /** Set once imported. */
  recordingId: string | null;
  visitId: string | null;
}

export interface BidsImportPreview {
  studyId: string;
  dryRun: boolean;
  /** True only when every file was imported. */
  imported: boolean;
  files: BidsImportFilePreview[];
  /** Problems of the upload as a whole (a sidecar without its recording, an unreadable TSV). */
  problems: string[];
  summary: {
    files: number;
    withProblems: number;
    newParticipants: number;
    newVisits: number;
  };
}

/** Body of the 422 that refuses an import: `details.preview`. */
export interface BidsImportRefusalDetails {
  preview: BidsImportPreview;
}
