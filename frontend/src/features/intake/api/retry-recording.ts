import type { RecordingView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { recordingsKey } from './recordings';

/** `POST /api/recordings/:id/retry`: queues a failed computation again. */
export function retryRecording(recordingId: string): Promise<RecordingView> {
  return apiSend<RecordingView>(`/api/recordings/${encodeURIComponent(recordingId)}/retry`, 'POST');
}

export function useRetryRecording() {
  return useWrite(
    (recording: RecordingView) => retryRecording(recording.id),
    (mutate, _updated, recording) => mutate(recordingsKey(recording.visitId)),
  );
}
