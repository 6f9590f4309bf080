import type { QualityDto } from '@gyre/shared';
import { describe, expect, it } from 'vitest';
import { LINE_NOISE_WARNING_RATIO, qualityFindings } from './quality-findings';

const clean: QualityDto = {
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

const lineNoise = (quality: QualityDto) =>
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
});
