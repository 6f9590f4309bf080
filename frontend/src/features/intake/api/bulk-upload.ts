import type { BulkUploadReport } from '@gyre/shared';
import type { UploadOptions } from '../../../lib/api-client';
import { postStudyImport, refusedOutcomeOf, useStudyImport } from './study-import';

/** The 422 of a bulk upload with a failing row: nothing was imported, the report says why. */
export const BULK_ROWS_INVALID = 'BULK_UPLOAD_ROWS_INVALID';

export interface BulkUploadInput {
  studyId: string;
  manifest: File;
  /** The recordings and onset CSVs the manifest names. */
  files: File[];
  dryRun: boolean;
}

/** The per-row report a refused import carries in `details.report`, when it has that shape. */
export function reportOfError(error: unknown): BulkUploadReport | null {
  return refusedOutcomeOf<BulkUploadReport>(error, BULK_ROWS_INVALID, 'report', (report) =>
    Array.isArray(report.rows),
  );
}

/**
 * `POST /api/studies/:studyId/bulk-uploads[?dryRun=true]` (multipart: `manifest`, then every
 * `files` part). A dry run answers 200 with the report; an import 201, or 422
 * `BULK_UPLOAD_ROWS_INVALID` with the report when any row fails (then nothing was imported).
 */
export function bulkUpload(
  input: BulkUploadInput,
  options: UploadOptions = {},
): Promise<BulkUploadReport> {
  const form = new FormData();
  form.append('manifest', input.manifest, input.manifest.name);
  for (const file of input.files) form.append('files', file, file.name);
  return postStudyImport(input.studyId, 'bulk-uploads', form, input.dryRun, options);
}

/** What a bulk upload can add to: visits (and their recordings). */
const REFRESHED = ['/api/visits', '/api/recordings'] as const;

/** A bulk upload; after an import, the visit, due and recording lists are read again. */
export function useBulkUpload() {
  return useStudyImport(bulkUpload, REFRESHED);
}
