import { Flex } from 'antd';
import { useSession } from '../../../lib/session/session-context';
import { useDismissedRecordings } from '../hooks/use-dismissed-recordings';
import { useLiveRecordings } from '../hooks/use-live-recordings';
import { RecordingDropzone } from './recording-dropzone';
import { RecordingsTable } from './recordings-table';

/**
 * One visit's uploads and recordings. It owns the visit's live list (streams or polling) and
 * the dismissed rejections; render it keyed by the visit, so that choosing another visit
 * starts clean: no upload line, stream or row of the previous visit stays.
 */
export function VisitIntake({ visitId, visitName }: { visitId: string; visitName: string }) {
  const { me } = useSession();
  const recordings = useLiveRecordings(visitId);
  const { dismissed, dismiss } = useDismissedRecordings(me.user.id);
  return (
    <Flex vertical gap={16}>
      <RecordingDropzone
        visitId={visitId}
        visitName={visitName}
        recordings={recordings.data?.items ?? []}
        onDismissRecording={dismiss}
      />
      <RecordingsTable recordings={recordings} dismissed={dismissed} onDismiss={dismiss} />
    </Flex>
  );
}
