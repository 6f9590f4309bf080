import type { RecordingView } from '@gyre/shared';
import { describe, expect, it } from 'vitest';
import { recordingNoticeOf } from './recording-state-notice';

// Generated test data: one recording in each state.
const recording = (state: RecordingView['state'], extra: Partial<RecordingView> = {}) =>
  ({ id: 'rec-1', state, progressPercent: null, ...extra }) as RecordingView;

describe('one recording state notice', () => {
  it('while computed again over the previous results, says both things in one notice', () => {
    const queued = recordingNoticeOf(recording('queued'), true);
    expect(queued?.title).toBe(
      'Waiting for its turn to be computed again; the previous results stay below until then.',
    );
    const computing = recordingNoticeOf(recording('computing', { progressPercent: 45 }), true);
    expect(computing?.title.replace(/\s/g, ' ')).toBe(
      'Computing again: 45 % done; these are the previous results.',
    );
    expect(computing?.progressPercent).toBe(45);
  });

  it('without previous results, says only the state', () => {
    expect(recordingNoticeOf(recording('queued'))?.title).toBe(
      'Waiting for its turn to be computed.',
    );
    expect(recordingNoticeOf(recording('computing'))?.title.replace(/\s/g, ' ')).toBe(
      'Computing: 0 % done.',
    );
    expect(recordingNoticeOf(recording('validating'))?.title).toBe('The file is being checked.');
  });

  it('explains failures and rejections, and says nothing when ready', () => {
    expect(recordingNoticeOf(recording('failed', { failureMessage: 'worker stopped' }))).toEqual({
      type: 'error',
      title: 'The computation failed.',
      description: 'worker stopped',
    });
    expect(recordingNoticeOf(recording('ready'))).toBeNull();
  });

  it('keeps a stray progress inside 0–100 %', () => {
    expect(
      recordingNoticeOf(recording('computing', { progressPercent: 130 }))?.progressPercent,
    ).toBe(100);
  });
});
