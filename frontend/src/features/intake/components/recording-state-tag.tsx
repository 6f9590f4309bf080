import type { RecordingState } from '@gyre/shared';
import { Tag } from 'antd';

const LOOK: Record<RecordingState, { label: string; color: string }> = {
  received: { label: 'Received', color: 'default' },
  queued: { label: 'Queued', color: 'blue' },
  computing: { label: 'Computing', color: 'processing' },
  ready: { label: 'Ready', color: 'success' },
  rejected: { label: 'Rejected', color: 'error' },
  failed: { label: 'Failed', color: 'warning' },
};

export function RecordingStateTag({ state }: { state: RecordingState }) {
  const look = LOOK[state];
  return (
    <Tag color={look.color} data-state={state}>
      {look.label}
    </Tag>
  );
}
