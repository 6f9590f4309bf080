import type { RecordingKind, RecordingRejection } from '@gyre/shared';

/** A resting file with stimulus onsets, or a task file without any, looks like the other kind. */
export function kindMismatch(
  kind: RecordingKind,
  stimulusOnsetCount: number,
): { rejection: RecordingRejection; details: Record<string, unknown> } | null {
  if (kind === 'resting' && stimulusOnsetCount > 0) {
    const found = `${stimulusOnsetCount} stimulus onset${stimulusOnsetCount === 1 ? '' : 's'}`;
    return {
      rejection: {
        message: `kind: this file holds ${found} (EDF+ annotations), so it looks like a task recording, not a resting one. Upload it as task, or confirm that it is a resting recording.`,
        field: 'kind',
        found,
        expected: 'no stimulus onsets in a resting recording',
      },
      details: { kind, onsetCount: stimulusOnsetCount, found, expected: 'no stimulus onsets' },
    };
  }
  if (kind === 'task' && stimulusOnsetCount === 0) {
    const found = 'no stimulus onsets (no EDF+ annotation and no onset CSV)';
    return {
      rejection: {
        message: `kind: this file has ${found}, so a task analysis has nothing to average around. Add the onset CSV, upload it as resting, or confirm that it is a task recording.`,
        field: 'kind',
        found,
        expected: 'stimulus onsets in a task recording',
      },
      details: { kind, onsetCount: 0, found, expected: 'at least one stimulus onset' },
    };
  }
  return null;
}

export function kindWarning(kind: RecordingKind, stimulusOnsetCount: number): string {
  return kind === 'resting'
    ? `Uploaded as resting although the file holds ${stimulusOnsetCount} stimulus onset(s); the technician confirmed the kind.`
    : 'Uploaded as task although the file has no stimulus onsets; the technician confirmed the kind.';
}
