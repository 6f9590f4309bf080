import { DEFAULT_POSTERIOR_ROI, roiChannelIndices, roiChannels } from './region-of-interest';

describe('region of interest', () => {
  it('is the posterior set of docs/method.md §1', () => {
    expect(DEFAULT_POSTERIOR_ROI.join(' ')).toBe('O1 O2 Oz POz PO3 PO4 PO7 PO8 Pz P3 P4');
  });

  it('finds the ROI channels present, in file order, each electrode once', () => {
    const labels = [
      'EEG Fp1-REF',
      'EEG O2-REF',
      'ECG',
      'o1-A1',
      'EEG Cz-REF',
      'O1-A2',
      'EEG POz',
      'P3-O1',
    ];
    expect(roiChannelIndices(labels)).toEqual([1, 3, 6]);
    expect(roiChannels(labels).map((c) => c.canonical)).toEqual(['O2', 'O1', 'POz']);
  });

  it('takes a study-specific ROI in any label spelling', () => {
    expect(roiChannelIndices(['EEG C3-REF', 'C4', 'Cz'], ['EEG C3', 'c4'])).toEqual([0, 1]);
  });

  it('returns nothing when no ROI channel is present', () => {
    expect(roiChannelIndices(['Fp1', 'Fp2', 'ECG'])).toEqual([]);
  });
});
