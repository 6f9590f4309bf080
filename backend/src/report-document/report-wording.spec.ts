import { roiUsageWords } from './report-wording';

describe('roiUsageWords', () => {
  it('lists the default names a montage lacks without calling the region partial', () => {
    const words = roiUsageWords({
      wanted: ['O1', 'O2', 'Oz', 'POz'],
      used: ['EEG O1-REF', 'EEG O2-REF'],
      leftOut: [
        { label: 'Oz', reason: 'missing' },
        { label: 'POz', reason: 'missing' },
      ],
      status: 'complete',
    });
    expect(words).toContain('those present; not in the file: Oz');
    expect(words).not.toContain('Left out');
  });

  it('names a channel left out for a doubtful reason with that reason', () => {
    const words = roiUsageWords({
      wanted: ['O1', 'O2'],
      used: ['EEG O1-REF'],
      leftOut: [{ label: 'EEG O2-REF', reason: 'flat' }],
      status: 'partial',
    });
    expect(words).toContain('1 of 2 wanted');
    expect(words).toContain('Left out: EEG O2-REF — flat');
  });
});
