import type { RecordingDto, RecordingKind } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiUpload, type UploadOptions } from '../../../lib/api-client';
import { recordingsKey } from './recordings';

export interface UploadRecordingInput {
  visitId: string;
  kind: RecordingKind;
  file: File;
  /** The optional CSV of stimulus onsets, only beside a task recording. */
  onsets?: File | null;
}

/**
 * `POST /api/visits/:visitId/recordings` (multipart: `kind`, optional `onsets`, `file`).
 * A refused file answers 422 with the reader's message and the field it names.
 */
export function uploadRecording(
  input: UploadRecordingInput,
  options: UploadOptions = {},
): Promise<RecordingDto> {
  const form = new FormData();
  // Text fields first, so the server knows the kind before the file streams in.
  form.append('kind', input.kind);
  if (input.onsets) form.append('onsets', input.onsets, input.onsets.name);
  form.append('file', input.file, input.file.name);
  return apiUpload<RecordingDto>(
    `/api/visits/${encodeURIComponent(input.visitId)}/recordings`,
    form,
    options,
  );
}

export function useUploadRecording() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (input: UploadRecordingInput, options: UploadOptions = {}) => {
      try {
        return await uploadRecording(input, options);
      } finally {
        // A refused file is listed too (state `rejected`), so refresh the table either way.
        await mutate(recordingsKey(input.visitId));
      }
    },
    [mutate],
  );
}
