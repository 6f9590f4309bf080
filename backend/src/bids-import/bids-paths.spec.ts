import { folderProblem, parseBidsName, safeRelativePath } from './bids-paths';

describe('BIDS file names (BIDS Common principles: "File name structure")', () => {
  it('reads the entities, suffix and extension of an EEG recording and its sidecars', () => {
    expect(parseBidsName('ds/sub-01/ses-base/eeg/sub-01_ses-base_task-rest_run-2_eeg.edf')).toEqual(
      {
        entities: { sub: '01', ses: 'base', task: 'rest', run: '2' },
        suffix: 'eeg',
        extension: '.edf',
        stem: 'sub-01_ses-base_task-rest_run-2',
      },
    );
    expect(parseBidsName('sub-01_ses-base_task-rest_channels.tsv')?.suffix).toBe('channels');
    expect(parseBidsName('sub-01_ses-base_task-rest_eeg.json')?.extension).toBe('.json');
  });

  it('refuses names that break the rules: no sub-, a non-alphanumeric label, an entity twice', () => {
    expect(parseBidsName('ses-base_task-rest_eeg.edf')).toBeNull();
    expect(parseBidsName('sub-0_1_task-rest_eeg.edf')).toBeNull();
    expect(parseBidsName('sub-01_task-a_task-b_eeg.edf')).toBeNull();
    expect(parseBidsName('README')).toBeNull();
  });

  it('checks the folder against the name (Common principles: "Filesystem structure")', () => {
    const name = parseBidsName('sub-01_ses-base_task-rest_eeg.edf');
    if (name === null) throw new Error('parse failed');
    expect(
      folderProblem('ds/sub-01/ses-base/eeg/sub-01_ses-base_task-rest_eeg.edf', name),
    ).toBeNull();
    // A session folder dropped alone starts below sub-01.
    expect(folderProblem('ses-base/eeg/sub-01_ses-base_task-rest_eeg.edf', name)).toBeNull();
    expect(folderProblem('ds/sub-02/ses-base/eeg/sub-01_ses-base_task-rest_eeg.edf', name)).toMatch(
      /folder 'sub-02' disagrees/,
    );
    expect(
      folderProblem('ds/sub-01/ses-base/anat/sub-01_ses-base_task-rest_eeg.edf', name),
    ).toMatch(/not in an 'eeg' folder/);
  });
});

describe('paths from the client (zip slip; common practice)', () => {
  it.each([
    ['../sub-01/eeg/x_eeg.edf', /'\.\.' or '\.' segment/],
    ['ds/sub-01/../../etc/x', /'\.\.' or '\.' segment/],
    ['/etc/passwd', /absolute path/],
    ['C:\\temp\\x_eeg.edf', /absolute path/],
    ['ds//x_eeg.edf', /empty segment/],
    ['ds/x\u0000_eeg.edf', /control character/],
  ])('%s is refused', (raw, problem) => {
    const safe = safeRelativePath(raw);
    expect('problem' in safe && safe.problem).toMatch(problem);
  });

  it('keeps an ordinary path, backslashes turned into slashes', () => {
    expect(safeRelativePath('ds\\sub-01\\eeg\\x_eeg.edf')).toEqual({
      path: 'ds/sub-01/eeg/x_eeg.edf',
    });
  });
});
