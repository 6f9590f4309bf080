import { canonicalElectrodeName, normaliseChannelLabel } from './channel-labels';

describe('normaliseChannelLabel (ACNS Guideline 2, 2016, 10-10 names)', () => {
  it.each([
    ['EEG O1-REF', 'O1'],
    ['O1', 'O1'],
    ['o1-A1', 'O1'], // referential to the left ear (A1, ACNS 2016)
    ['EEG Oz', 'Oz'], // midline: lower-case z (ACNS 2016)
    ['OZ', 'Oz'],
    ['EEG POZ-REF', 'POz'],
    ['po7-M1', 'PO7'], // mastoid reference M1 (ACNS 2016)
    ['EEG FP1-AVG', 'Fp1'],
    ['fpz', 'Fpz'],
    ['EEG T3-REF', 'T7'], // T3 renamed T7 in the 10-10 system (ACNS 2016)
    ['T5', 'P7'], // T5 renamed P7 (ACNS 2016)
    ['EEG-Pz', 'Pz'],
    ['P3 - REF', 'P3'],
    ['  EEG  P4-Ref ', 'P4'],
    ['AF10', 'AF10'],
  ])('%s → %s', (label, canonical) => {
    expect(normaliseChannelLabel(label)).toBe(canonical);
  });

  it.each([
    'EEG Fpz-Cz', // bipolar derivation, not a single electrode (Kemp & Olivan 2003 example label)
    'P3-O1', // bipolar
    'ECG', // another signal type
    'EOG O1', // another signal type (Kemp & Olivan 2003 type prefix)
    'EDF Annotations',
    'O11', // no such 10-10 position
    'X1',
    'O1-',
    '',
  ])('%s → null', (label) => {
    expect(normaliseChannelLabel(label)).toBeNull();
  });

  it('spells prefixes as in the 10-10 chart (ACNS 2016)', () => {
    expect(['FC3', 'ft9', 'CPZ', 'tp10', 'i1', 'nz'].map(canonicalElectrodeName)).toEqual([
      'FC3',
      'FT9',
      'CPz',
      'TP10',
      'I1',
      'Nz',
    ]);
  });
});
