import type { BulkUploadReport } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { ApiError, apiUpload, type UploadOptions } from '../../../lib/api-client';
import { isRecordingsKey } from './recordings';

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
  if (!(error instanceof ApiError) || error.code !== BULK_ROWS_INVALID) return null;
  const report = (error.details as { report?: BulkUploadReport } | null)?.report;
  return report !== undefined && Array.isArray(report.rows) ? report : null;
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
  const query = input.dryRun ? '?dryRun=true' : '';
  return apiUpload<BulkUploadReport>(
    `/api/studies/${encodeURIComponent(input.studyId)}/bulk-uploads${query}`,
    form,
    options,
  );
}

/** A bulk upload; after an import, the visit, due and recording lists are read again. */
export function useBulkUpload() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (input: BulkUploadInput, options: UploadOptions = {}) => {
      const report = await bulkUpload(input, options);
      if (report.imported) {
        await mutate(
          (key) =>
            isRecordingsKey(key) ||
            (typeof key === 'string' &&
              (key.startsWith('/api/visits') ||
                key.startsWith('/api/recordings') ||
                key.includes('/due'))),
        );
      }
      return report;
    },
    [mutate],
  );
}
