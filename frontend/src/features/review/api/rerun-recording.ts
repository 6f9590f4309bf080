import type { JobDto, RecordingDto } from '@gyre/shared';
import { mutate } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { visitRecordingsKey } from './get-visit-recordings';

/** `POST /api/recordings/:recordingId/runs`: computes one recording again with the current settings. */
export async function rerunRecording(
  recording: RecordingDto,
  reason: string | null,
): Promise<JobDto> {
  const job = await apiSend<JobDto>(
    `/api/recordings/${encodeURIComponent(recording.id)}/runs`,
    'POST',
    reason === null ? {} : { reason },
  );
  await mutate(visitRecordingsKey(recording.visitId));
  return job;
}
