import type { QualityView } from '@gyre/shared';
import { describe, expect, it } from 'vitest';
import { LINE_NOISE_WARNING_RATIO, qualityFindings } from './quality-findings';

const clean: QualityView = {
  durationS: 180,
  sampleRatesHz: [250],
  roiChannelsFound: ['O1', 'O2', 'Oz', 'Pz'],
  roiChannelsMissing: [],
  flatChannels: [],
  saturatedChannels: [],
  lineNoiseRatio50Hz: 1.1,
  lineNoiseRatio60Hz: 0.98,
  epochsDroppedShare: 0,
  phaseSlipShare: 0.01,
  alphaPeakProminenceDb: 9,
  channels: [],
  warnings: [],
};

const lineNoise = (quality: QualityView) =>
  qualityFindings(quality, 'resting').find((f) => f.check.startsWith('Line noise'));

describe('qualityFindings: line noise', () => {
  it('says nothing when mains power is like its neighbours', () => {
    expect(lineNoise(clean)?.warning).toBeNull();
  });

  it(`warns, naming the worse mains frequency, from ${LINE_NOISE_WARNING_RATIO}× upwards`, () => {
    const warning = lineNoise({
      ...clean,
      lineNoiseRatio50Hz: 21.67,
      lineNoiseRatio60Hz: 12,
    })?.warning;
    expect(warning).toContain('50 Hz (21.7 times');
    expect(
      lineNoise({ ...clean, lineNoiseRatio50Hz: null, lineNoiseRatio60Hz: 10 })?.warning,
    ).toContain('60 Hz');
    expect(lineNoise({ ...clean, lineNoiseRatio50Hz: 9.99 })?.warning).toBeNull();
  });

  // EEG-BIDS `*_eeg.json` PowerLineFrequency names the mains of the recording site: only that
  // frequency's check applies.
  it('applies only the declared line frequency when the source declared one', () => {
    const noisy50 = { ...clean, lineNoiseRatio50Hz: 21.67, lineNoiseRatio60Hz: 0.98 };
    const declared60 = qualityFindings(noisy50, 'resting', undefined, 60).find((f) =>
      f.check.startsWith('Line noise'),
    );
    expect(declared60?.check).toBe("Line noise (60 Hz, as the file's source declared)");
    expect(declared60?.value).toBe('0.98 (median power ratio over channels)');
    expect(declared60?.warning).toBeNull();
    const declared50 = qualityFindings(noisy50, 'resting', undefined, 50).find((f) =>
      f.check.startsWith('Line noise'),
    );
    expect(declared50?.warning).toContain('50 Hz (21.7 times');
  });
});

describe('qualityFindings: region of interest', () => {
  const used = (roiUsage: Parameters<typeof qualityFindings>[2]) =>
    qualityFindings(clean, 'task', roiUsage).find(
      (f) => f.check === 'Region-of-interest channels used',
    );

  it('warns when channels were found but none was used', () => {
    const finding = used({
      wanted: ['O1', 'O2'],
      used: [],
      leftOut: [
        { label: 'O1', reason: 'flat' },
        { label: 'O2', reason: 'sample-rate' },
      ],
      status: 'none',
    });
    expect(finding?.value).toBe('none');
    expect(finding?.warning).toBe(
      'No region-of-interest channel remains: O1 (flat), O2 (another sampling rate).',
    );
  });

  it('says nothing more when every wanted channel was used', () => {
    const finding = used({ wanted: ['O1'], used: ['O1'], leftOut: [], status: 'complete' });
    expect(finding?.value).toBe('O1');
    expect(finding?.warning).toBeNull();
  });
});
