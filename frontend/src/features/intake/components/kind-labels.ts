import type { RecordingKind } from '@gyre/shared';

export const KIND_LABELS: Record<RecordingKind, string> = { resting: 'Resting', task: 'Task' };
