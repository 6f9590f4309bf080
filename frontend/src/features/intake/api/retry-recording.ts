import type { RecordingDto } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { recordingsKey } from './recordings';

/** `POST /api/recordings/:id/retry`: queues a failed computation again. */
export function retryRecording(recordingId: string): Promise<RecordingDto> {
  return apiSend<RecordingDto>(`/api/recordings/${encodeURIComponent(recordingId)}/retry`, 'POST');
}

export function useRetryRecording() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (recording: RecordingDto) => {
      const updated = await retryRecording(recording.id);
      await mutate(recordingsKey(recording.visitId));
      return updated;
    },
    [mutate],
  );
}
