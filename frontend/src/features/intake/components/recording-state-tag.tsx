import type { RecordingView, RecordingState } from '@gyre/shared';
import { Tag } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { hasStandingWarnings } from './recording-notes';

const LOOK: Record<RecordingState, { label: string; color: string }> = {
  received: { label: 'Received', color: 'default' },
  validating: { label: 'Checking', color: 'blue' },
  queued: { label: 'Queued', color: 'blue' },
  computing: { label: 'Computing', color: 'processing' },
  ready: { label: 'Ready', color: 'success' },
  rejected: { label: 'Rejected', color: 'error' },
  failed: { label: 'Failed', color: 'warning' },
  superseded: { label: 'Superseded', color: 'default' },
};

/** The state in one word; a ready recording with something to say is "ready with warnings". */
export function RecordingStateTag({ recording }: { recording: RecordingView }) {
  if (recording.state === 'ready' && hasStandingWarnings(recording)) {
    return (
      <Tag color={GYRE_COLORS.amber} data-state="ready-with-warnings">
        Ready with warnings
      </Tag>
    );
  }
  const look = LOOK[recording.state];
  return (
    <Tag color={look.color} data-state={recording.state}>
      {look.label}
    </Tag>
  );
}
