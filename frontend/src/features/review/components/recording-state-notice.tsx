import type { RecordingDto } from '@gyre/shared';
import { Alert, Progress } from 'antd';

/** What to show instead of results while a recording is not ready. */
export function RecordingStateNotice({ recording }: { recording: RecordingDto }) {
  switch (recording.state) {
    case 'received':
    case 'validating':
      return <Alert type="info" showIcon title="The file is being checked." />;
    case 'queued':
      return <Alert type="info" showIcon title="Waiting for its turn to be computed." />;
    case 'computing':
      return (
        <div aria-label="Computing">
          <Progress percent={Math.round(recording.progressPercent ?? 0)} status="active" />
        </div>
      );
    case 'failed':
      return (
        <Alert
          type="error"
          showIcon
          title="The computation failed."
          description={recording.failureMessage ?? 'No message was recorded.'}
        />
      );
    case 'rejected':
      return (
        <Alert
          type="warning"
          showIcon
          title="The file was rejected at upload."
          description={recording.rejection?.message ?? 'No reason was recorded.'}
        />
      );
    case 'superseded':
      return (
        <Alert
          type="info"
          showIcon
          title="Superseded: a newer recording of this kind replaced it."
        />
      );
    case 'ready':
      return null;
    default:
      return null;
  }
}
