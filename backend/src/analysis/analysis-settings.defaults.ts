import type { AnalysisSettingsValues } from '@gyre/shared';
import { DEFAULT_POSTERIOR_ROI } from '../signal/channels';

/**
 * Version 1 of every study's settings (METHOD.md §2–3): band from the visit's IAF ± 2 Hz
 * or 8–13 Hz, zero-phase filter, epochs −1…+2 s, baseline −0.5…0 s, post +0.2…+0.8 s,
 * ±100 µV rejection (common practice), slowing suggested at Δf ≤ −0.2 Hz.
 */
export const DEFAULT_ANALYSIS_SETTINGS: Readonly<AnalysisSettingsValues> =
  Object.freeze<AnalysisSettingsValues>({
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
  });

/** Alpha band used when neither the settings nor a resting IAF give one (METHOD.md §2). */
export const DEFAULT_ALPHA_BAND_HZ: [number, number] = [8, 13];
/** Half-width of the individual band around the IAF (METHOD.md §2). */
export const IAF_HALF_WIDTH_HZ = 2;
/** Bootstrap over trials: 2000 resamples, fixed seed (METHOD.md §3; Efron & Tibshirani 1993). */
export const BOOTSTRAP_RESAMPLES = 2000;
export const BOOTSTRAP_SEED = 20140401;
