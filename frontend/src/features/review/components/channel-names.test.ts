import { describe, expect, it } from 'vitest';
import { normaliseChannelLabel as canonicalChannelName } from '@gyre/shared/channel-labels';
import { channelOptionsOf } from './channel-names';

describe('10-10 channel names (ACNS Guideline 2, 2016)', () => {
  it.each([
    ['EEG O1-REF', 'O1'],
    ['o1-A1', 'O1'], // referential to the left ear
    ['EEG POZ-REF', 'POz'], // midline: lower-case z
    ['EEG T3-REF', 'T7'], // T3 renamed T7 in the 10-10 system
    ['  EEG  P4-Ref ', 'P4'],
  ])('%s → %s', (label, name) => {
    expect(canonicalChannelName(label)).toBe(name);
  });

  it.each(['P3-O1', 'ECG', 'EOG O1', 'EDF Annotations', 'O11'])(
    '%s is not one scalp electrode',
    (label) => {
      expect(canonicalChannelName(label)).toBeNull();
    },
  );

  it("offers each electrode once, with the file's spelling beside it", () => {
    expect(channelOptionsOf(['EEG O1-REF', 'ECG', 'O1-A2', 'Pz', 'P3-O1'])).toEqual([
      { value: 'O1', label: 'O1 (EEG O1-REF)' },
      { value: 'Pz', label: 'Pz' },
    ]);
  });
});
