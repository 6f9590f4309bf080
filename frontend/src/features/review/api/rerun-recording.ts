import type { JobView, RecordingView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitRecordingsKey } from './get-visit-recordings';

/** `POST /api/recordings/:recordingId/runs`: computes one recording again with the current settings. */
export function rerunRecording(recordingId: string, reason: string | null): Promise<JobView> {
  return apiSend<JobView>(
    `/api/recordings/${encodeURIComponent(recordingId)}/runs`,
    'POST',
    reason === null ? {} : { reason },
  );
}

export function useRerunRecording() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (recording: RecordingView, reason: string | null) => {
      const job = await rerunRecording(recording.id, reason);
      await mutate(visitRecordingsKey(recording.visitId));
      return job;
    },
    [mutate],
  );
}
