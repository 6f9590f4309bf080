import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { ApiError, apiUpload, type UploadOptions } from '../../../lib/api-client';
import { isRecordingsKey } from './recordings';

/** What every study import answers: a check (dry run) or an import that stored everything. */
export interface ImportOutcome {
  dryRun: boolean;
  imported: boolean;
}

/**
 * `POST /api/studies/:studyId/<endpoint>[?dryRun=true]` with a multipart form. A dry run answers
 * 200 with the outcome; an import 201, or 422 with the outcome in its details.
 */
export function postStudyImport<T extends ImportOutcome>(
  studyId: string,
  endpoint: string,
  form: FormData,
  dryRun: boolean,
  options: UploadOptions,
): Promise<T> {
  const query = dryRun ? '?dryRun=true' : '';
  return apiUpload<T>(
    `/api/studies/${encodeURIComponent(studyId)}/${endpoint}${query}`,
    form,
    options,
  );
}

/**
 * The outcome a refused import (422 `code`: nothing was stored) carries in `details[field]`,
 * when `hasShape` accepts it.
 */
export function refusedOutcomeOf<T extends ImportOutcome>(
  error: unknown,
  code: string,
  field: string,
  hasShape: (value: T) => boolean,
): T | null {
  if (!(error instanceof ApiError) || error.code !== code) return null;
  const value = error.details?.[field] as T | undefined;
  return value !== undefined && value !== null && hasShape(value) ? value : null;
}

/**
 * An import call whose success makes the lists it fed stale: after an import (not a check),
 * Intake's recording pages, every list under `pathPrefixes` and the due lists are read again.
 * `call` and `pathPrefixes` must be module constants (they are the callback's dependencies).
 */
export function useStudyImport<I, T extends ImportOutcome>(
  call: (input: I, options: UploadOptions) => Promise<T>,
  pathPrefixes: readonly string[],
) {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (input: I, options: UploadOptions = {}) => {
      const outcome = await call(input, options);
      if (outcome.imported) {
        await mutate(
          (key) =>
            isRecordingsKey(key) ||
            (typeof key === 'string' &&
              (pathPrefixes.some((prefix) => key.startsWith(prefix)) || key.includes('/due'))),
        );
      }
      return outcome;
    },
    [call, pathPrefixes, mutate],
  );
}
