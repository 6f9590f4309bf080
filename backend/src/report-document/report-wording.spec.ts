import {
  amplitudeGateWords,
  depthSettingsRows,
  differenceNote,
  disagreementWarning,
  roiUsageWords,
} from './report-wording';
import { SAMPLE_TASK_DEPTH } from './testing/sample-visit-report-model';

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

describe('analysis-depth wording', () => {
  const NBSP = '\u00A0';

  it('says whether the difference pair came from the settings or was the first two found', () => {
    const difference = SAMPLE_TASK_DEPTH.conditionDifference!;
    expect(differenceNote(difference)).toContain("named in the study's analysis settings");
    expect(differenceNote({ ...difference, chosenBy: 'first-two' })).toContain(
      'the first two conditions found in the onsets',
    );
  });

  it('warns only when the estimates disagree, naming both the difference and the threshold', () => {
    expect(disagreementWarning(SAMPLE_TASK_DEPTH)).toContain(
      `differ by 0.15${NBSP}Hz, more than the threshold of 0.10${NBSP}Hz in the settings the run was computed with`,
    );
    const agreeing = { ...SAMPLE_TASK_DEPTH.cycles!, disagrees: false };
    expect(disagreementWarning({ ...SAMPLE_TASK_DEPTH, cycles: agreeing })).toBeNull();
    expect(disagreementWarning({ ...SAMPLE_TASK_DEPTH, cycles: null })).toBeNull();
  });

  it('writes the gate as its percentile and the share left out (a share of 0 samples says so)', () => {
    expect(amplitudeGateWords({ percentile: 10, excludedSamples: 1, totalSamples: 8 })).toBe(
      `samples under percentile 10 of each channel's envelope; 12.5${NBSP}% of the region's samples left out`,
    );
    expect(amplitudeGateWords({ percentile: 10, excludedSamples: 0, totalSamples: 0 })).toContain(
      'no samples counted',
    );
  });

  it('names the three settings in the provenance, "off" and "the first two found" for the defaults', () => {
    expect(
      depthSettingsRows({
        amplitudeGatePercentile: null,
        cycleDisagreementHz: 0.1,
        compareConditions: null,
      }),
    ).toEqual([
      ['Amplitude gate', 'off'],
      ['Cross-check threshold', `0.10${NBSP}Hz`],
      ['Conditions compared', 'the first two found'],
    ]);
  });
});
