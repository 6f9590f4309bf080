/**
 * Bulk upload: many recordings of one study at once, described by a CSV manifest
 * (`POST /api/studies/:studyId/bulk-uploads`). Every row is checked and reported on its own;
 * either every row is imported in one transaction or nothing is.
 */
import type { RecordingKind } from './recordings';

/** The manifest's columns, in the order the example in the user guide writes them. */
export const BULK_MANIFEST_COLUMNS = [
  'participant_code',
  'planned_visit',
  'kind',
  'file',
  'onsets_file',
  'visit_date',
  'confirm_kind',
] as const;
export type BulkManifestColumn = (typeof BULK_MANIFEST_COLUMNS)[number];

/** Columns every manifest must have (the others may be left out or empty). */
export const BULK_MANIFEST_REQUIRED_COLUMNS: readonly BulkManifestColumn[] = [
  'participant_code',
  'planned_visit',
  'kind',
  'file',
];

/**
 * `ok`: would be (or was) imported; `warning`: would be imported, with something to look at
 * (a visit date outside the planned window, a confirmed kind); `error`: stops the whole import.
 */
export type BulkRowStatus = 'ok' | 'warning' | 'error';

/** One manifest row as checked. */
export interface BulkUploadRowReport {
  /** 1-based data row (the header is row 0), as a spreadsheet shows it minus one. */
  row: number;
  participantCode: string;
  plannedVisit: string;
  kind: string;
  file: string;
  onsetsFile: string | null;
  status: BulkRowStatus;
  /** Why the row cannot be imported; empty unless `status` is `error`. */
  errors: string[];
  warnings: string[];
  /** Whether the row's visit exists already or is created by the import. */
  visit: 'existing' | 'new' | null;
  /** Set once imported: the new recording and its visit. */
  recordingId: string | null;
  visitId: string | null;
}

/** An uploaded file that no manifest row names: an error of the upload as a whole. */
export interface BulkUploadStrayFile {
  file: string;
  message: string;
}

export interface BulkUploadReport {
  studyId: string;
  dryRun: boolean;
  /** True only when every row was imported. */
  imported: boolean;
  rows: BulkUploadRowReport[];
  strayFiles: BulkUploadStrayFile[];
  summary: {
    rows: number;
    ok: number;
    warnings: number;
    errors: number;
    /** Visits the import creates (dry run: would create). */
    newVisits: number;
  };
}

/** Body of the 422 that refuses a bulk upload: `details.report`. */
export interface BulkUploadRefusalDetails {
  report: BulkUploadReport;
}

/** The kinds a manifest row may name. */
export type BulkRowKind = RecordingKind;
