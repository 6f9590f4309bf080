import type { RecordingView } from '@gyre/shared';
import { useCallback } from 'react';
import { apiDownload, saveBlob } from '../../../lib/api-client';

/** `GET /api/recordings/:id/file`: the stored copy, its patient field blanked. */
export function recordingFilePath(recordingId: string): string {
  return `/api/recordings/${encodeURIComponent(recordingId)}/file`;
}

export async function downloadRecording(recording: RecordingView): Promise<void> {
  const { blob, fileName } = await apiDownload(recordingFilePath(recording.id));
  saveBlob(blob, fileName ?? `${recording.kind}-${recording.createdAt.slice(0, 10)}.edf`);
}

/** A download changes nothing on the server, so there is no cache to refresh. */
export function useDownloadRecording() {
  return useCallback((recording: RecordingView) => downloadRecording(recording), []);
}
