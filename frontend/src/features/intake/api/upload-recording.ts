import type { RecordingView, RecordingKind, UploadRecordingFields } from '@gyre/shared';
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
  /** The technician confirmed the kind although the file looks like the other kind. */
  confirmKind?: boolean;
  /** The visit's current recording of this kind that this upload replaces, and why. */
  replaces?: { recordingId: string; reason: string } | null;
}

/** Error codes of this call that Intake resolves with the technician (see shared/recordings.ts). */
export const KIND_UNCONFIRMED = 'RECORDING_KIND_UNCONFIRMED';
export const KIND_TAKEN = 'RECORDING_KIND_TAKEN';

/** The multipart text fields of an upload, as the server reads them. */
export function uploadFieldsOf(input: UploadRecordingInput): UploadRecordingFields {
  return {
    kind: input.kind,
    ...(input.confirmKind === true ? { confirmKind: 'true' as const } : {}),
    ...(input.replaces
      ? { replaces: input.replaces.recordingId, replacementReason: input.replaces.reason }
      : {}),
  };
}

/**
 * `POST /api/visits/:visitId/recordings` (multipart: `kind`, optional `confirmKind`, `replaces`,
 * `replacementReason`, `onsets`, then `file`). A refused file answers 422 with the reader's
 * message; a file that looks like the other kind 422 `RECORDING_KIND_UNCONFIRMED`; a kind the
 * visit already has 409 `RECORDING_KIND_TAKEN`.
 */
export function uploadRecording(
  input: UploadRecordingInput,
  options: UploadOptions = {},
): Promise<RecordingView> {
  const form = new FormData();
  // Text fields first, so the server knows the kind before the file streams in.
  for (const [name, value] of Object.entries(uploadFieldsOf(input))) {
    if (typeof value === 'string') form.append(name, value);
  }
  if (input.onsets) form.append('onsets', input.onsets, input.onsets.name);
  form.append('file', input.file, input.file.name);
  return apiUpload<RecordingView>(
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
