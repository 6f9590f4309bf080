import type { RecordingView } from '@gyre/shared';
import { Alert, Flex, Progress } from 'antd';
import { formatPercent } from '../../../lib/format';

export interface RecordingNotice {
  type: 'info' | 'warning' | 'error';
  title: string;
  description?: string;
  /** 0–100 while computing (drawn as a bar under the words). */
  progressPercent?: number;
}

/**
 * The one notice for a recording's state, in words: Review shows exactly one per recording,
 * from here. `previousShown`: the last results stay on screen below it while it is computed
 * again, and the notice says so (instead of a second notice saying "computing again").
 */
export function recordingNoticeOf(
  recording: RecordingView,
  previousShown = false,
): RecordingNotice | null {
  const again = previousShown ? ' again' : '';
  const below = previousShown ? '; the previous results stay below until then' : '';
  switch (recording.state) {
    case 'received':
    case 'validating':
      return { type: 'info', title: 'The file is being checked.' };
    case 'queued':
      return { type: 'info', title: `Waiting for its turn to be computed${again}${below}.` };
    case 'computing': {
      const percent = Math.min(100, Math.max(0, recording.progressPercent ?? 0));
      return {
        type: 'info',
        title: `Computing${again}: ${formatPercent(percent, 0)} done${
          previousShown ? '; these are the previous results' : ''
        }.`,
        progressPercent: percent,
      };
    }
    case 'failed':
      return {
        type: 'error',
        title: 'The computation failed.',
        description: recording.failureMessage ?? 'No message was recorded.',
      };
    case 'rejected':
      return {
        type: 'warning',
        title: 'The file was rejected at upload.',
        description: recording.rejection?.message ?? 'No reason was recorded.',
      };
    case 'superseded':
      return { type: 'info', title: 'Superseded: a newer recording of this kind replaced it.' };
    case 'ready':
      return null;
    default:
      return null;
  }
}

/** What to show instead of (or above) results while a recording is not ready: one notice. */
export function RecordingStateNotice({
  recording,
  previousShown = false,
}: {
  recording: RecordingView;
  previousShown?: boolean;
}) {
  const notice = recordingNoticeOf(recording, previousShown);
  if (notice === null) return null;
  return (
    <Alert
      type={notice.type}
      showIcon
      role="status"
      aria-label="Recording state"
      title={notice.title}
      description={
        notice.progressPercent === undefined ? (
          notice.description
        ) : (
          <Flex vertical aria-label="Computing">
            <Progress
              percent={Math.round(notice.progressPercent)}
              status="active"
              showInfo={false}
            />
          </Flex>
        )
      }
    />
  );
}
