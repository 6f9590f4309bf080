/**
 * The one vocabulary of analysis settings: the signal core computes with it, the server
 * stores it (one settings version = one `AnalysisSettings`), the worker receives it, the
 * command line and the benchmark build it, and the API sends it. The type is the shared
 * package's `AnalysisSettingsValues` (a type import: the signal core takes no run-time code
 * from `@gyre/shared`); one set of defaults, here.
 */
import type { AnalysisMethod, AnalysisSettingsValues, BandSource } from '@gyre/shared';
import { DEFAULT_POSTERIOR_ROI } from '../channels/region-of-interest';

/** Zero-phase plateau band-pass ('filter') or complex Morlet wavelet at the band centre. */
export type NarrowBandMethodName = AnalysisMethod;

/**
 * One settings version. `bandHz` null: the participant's resting IAF ± `IAF_HALF_WIDTH_HZ`
 * when the visit has a resting result, else `DEFAULT_ALPHA_BAND_HZ` (`resolveAnalysisBand`).
 */
export type AnalysisSettings = AnalysisSettingsValues;

/** Alpha band when neither the settings nor a resting IAF give one (common practice). */
export const DEFAULT_ALPHA_BAND_HZ: readonly [number, number] = [8, 13];
/** Half-width of the individual band around the resting IAF, Hz (common practice). */
export const IAF_HALF_WIDTH_HZ = 2;
/** Bootstrap over trials (Efron & Tibshirani 1993): resamples and the fixed seed every caller uses. */
export const BOOTSTRAP_RESAMPLES = 2000;
export const BOOTSTRAP_SEED = 20140401;

/**
 * Gyre's defaults, version 1 of every study's settings: band from the IAF or 8–13 Hz,
 * zero-phase filter, epochs −1…+2 s, baseline −0.5…0 s, post +0.2…+0.8 s, ±100 µV
 * rejection (common practice), slowing suggested at Δf ≤ −0.2 Hz, posterior ROI.
 */
export const DEFAULT_ANALYSIS_SETTINGS: Readonly<AnalysisSettings> = Object.freeze({
  bandHz: null,
  method: 'filter',
  morletCycles: 7,
  epochWindowS: [-1, 2],
  baselineWindowS: [-0.5, 0],
  postWindowS: [0.2, 0.8],
  rejectionThresholdUv: 100,
  flagThresholdHz: -0.2,
  roi: [...DEFAULT_POSTERIOR_ROI],
  onsetLabel: null,
  amplitudeGatePercentile: null,
  cycleDisagreementHz: 0.1,
  compareConditions: null,
} satisfies AnalysisSettings);

/** Where a run's band came from. */
export type AnalysisBandSource = BandSource;

/**
 * The band one run uses: the settings' fixed band, else the resting IAF ± 2 Hz, else
 * 8–13 Hz. The only place an IAF becomes a band.
 */
export function resolveAnalysisBand(
  settings: Pick<AnalysisSettings, 'bandHz'>,
  iafHz: number | null,
): { bandHz: [number, number]; bandSource: AnalysisBandSource } {
  if (settings.bandHz !== null) {
    return { bandHz: [settings.bandHz[0], settings.bandHz[1]], bandSource: 'settings' };
  }
  if (iafHz !== null && Number.isFinite(iafHz)) {
    return {
      bandHz: [iafHz - IAF_HALF_WIDTH_HZ, iafHz + IAF_HALF_WIDTH_HZ],
      bandSource: 'iaf',
    };
  }
  return { bandHz: [DEFAULT_ALPHA_BAND_HZ[0], DEFAULT_ALPHA_BAND_HZ[1]], bandSource: 'default' };
}

/** A deep copy with every array fresh, so callers never share one settings object's arrays. */
export function copyAnalysisSettings(settings: Readonly<AnalysisSettings>): AnalysisSettings {
  return {
    ...settings,
    bandHz: settings.bandHz === null ? null : [settings.bandHz[0], settings.bandHz[1]],
    epochWindowS: [settings.epochWindowS[0], settings.epochWindowS[1]],
    baselineWindowS: [settings.baselineWindowS[0], settings.baselineWindowS[1]],
    postWindowS: [settings.postWindowS[0], settings.postWindowS[1]],
    roi: [...settings.roi],
    compareConditions:
      settings.compareConditions === null
        ? null
        : [settings.compareConditions[0], settings.compareConditions[1]],
  };
}
