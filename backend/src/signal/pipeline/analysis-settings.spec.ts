import type { AnalysisSettingsValues } from '@gyre/shared';
import {
  copyAnalysisSettings,
  DEFAULT_ANALYSIS_SETTINGS,
  resolveAnalysisBand,
} from './analysis-settings';

/** Every key of the API type, enforced by the compiler (a missing or extra key does not compile). */
const API_KEYS: Record<keyof AnalysisSettingsValues, true> = {
  bandHz: true,
  method: true,
  morletCycles: true,
  epochWindowS: true,
  baselineWindowS: true,
  postWindowS: true,
  rejectionThresholdUv: true,
  flagThresholdHz: true,
  roi: true,
  onsetLabel: true,
  amplitudeGatePercentile: true,
  cycleDisagreementHz: true,
  compareConditions: true,
};

describe('DEFAULT_ANALYSIS_SETTINGS', () => {
  it('has exactly the API keys', () => {
    expect(Object.keys(DEFAULT_ANALYSIS_SETTINGS).sort()).toEqual(Object.keys(API_KEYS).sort());
  });

  it('copies without sharing arrays', () => {
    const copy = copyAnalysisSettings(DEFAULT_ANALYSIS_SETTINGS);
    expect(copy).toEqual(DEFAULT_ANALYSIS_SETTINGS);
    copy.roi.push('Fz');
    copy.epochWindowS[0] = -2;
    expect(DEFAULT_ANALYSIS_SETTINGS.roi).not.toContain('Fz');
    expect(DEFAULT_ANALYSIS_SETTINGS.epochWindowS[0]).toBe(-1);
  });
});

describe('resolveAnalysisBand', () => {
  // Gyre's rule (common practice): a fixed band wins, else the resting IAF ± 2 Hz, else 8–13 Hz.
  it('takes the fixed band, the IAF ± 2 Hz, or 8–13 Hz, and says which', () => {
    expect(resolveAnalysisBand({ bandHz: [7, 12] }, 10)).toEqual({
      bandHz: [7, 12],
      bandSource: 'settings',
    });
    expect(resolveAnalysisBand({ bandHz: null }, 9.5)).toEqual({
      bandHz: [7.5, 11.5],
      bandSource: 'iaf',
    });
    expect(resolveAnalysisBand({ bandHz: null }, null)).toEqual({
      bandHz: [8, 13],
      bandSource: 'default',
    });
    expect(resolveAnalysisBand({ bandHz: null }, Number.NaN).bandSource).toBe('default');
  });
});
