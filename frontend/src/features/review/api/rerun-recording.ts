import type { RecordingDto } from '@gyre/shared';
import { mutate } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitRecordingsKey } from './get-visit-recordings';

/** `POST /api/recordings/:recordingId/rerun`: computes again with the current settings. */
export async function rerunRecording(recording: RecordingDto): Promise<RecordingDto> {
  const queued = await apiSend<RecordingDto>(
    `/api/recordings/${encodeURIComponent(recording.id)}/rerun`,
    'POST',
  );
  await mutate(visitRecordingsKey(recording.visitId));
  return queued;
}
