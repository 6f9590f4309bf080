/**
 * Analysis beyond one Δf per visit: conditions (onset labels), the cycle-by-cycle cross-check,
 * amplitude-gated instantaneous frequency and the per-channel values scalp maps colour. The
 * signal core computes these into a run's summary; the results answer, Review, the visit
 * report, the exports and `npm run analyze` all show these shapes.
 */

/** Δf of the trials of one condition (onset label) in the region of interest. */
export interface ConditionStatsView {
  /** The onset label as first seen in the file or CSV (labels match case-insensitively). */
  label: string;
  /** Trials of this condition kept / chosen before any epoch was dropped. */
  trialsKept: number;
  trialsTotal: number;
  baselineHz: number | null;
  postHz: number | null;
  /** Mean over kept trials of post − baseline, Hz. */
  deltaFHz: number | null;
  /** Bootstrap 95 % interval of the mean Δf over this condition's trials, Hz. */
  ciHz: [number, number] | null;
  /** Two-sided Wilcoxon signed-rank p of this condition's trial Δf values. */
  pValue: number | null;
}

/** How the two conditions of a difference were chosen. */
export type ConditionPairSource = 'settings' | 'request' | 'first-two';

/** The difference between two conditions' mean Δf in the region of interest. */
export interface ConditionDifferenceView {
  /** Δf(first) − Δf(second). */
  first: string;
  second: string;
  chosenBy: ConditionPairSource;
  differenceHz: number | null;
  /** Bootstrap 95 % interval: trials resampled within each condition, Hz. */
  ciHz: [number, number] | null;
  /** Two-sided permutation-test p of the difference of means (labels shuffled). */
  pValue: number | null;
  permutations: number;
  seed: number;
}

/** The cycle-by-cycle estimate of Δf (periods between extrema), beside the phase-based one. */
export interface CycleEstimateView {
  baselineHz: number | null;
  postHz: number | null;
  deltaFHz: number | null;
  /** Bootstrap 95 % interval of the mean Δf over trials with burst cycles in both windows. */
  ciHz: [number, number] | null;
  /** Trials with at least one burst cycle in both the baseline and the post window. */
  trialsUsed: number;
  trialsTotal: number;
  /** Cycles in burst over all cycles found in the windows of the kept trials. */
  burstCycleShare: number | null;
  /** |Δf cycle-by-cycle − Δf phase-based|, Hz; null when either is missing. */
  disagreementHz: number | null;
  /** disagreementHz > the settings' `cycleDisagreementHz`. */
  disagrees: boolean;
}

/** Samples left out of one channel's frequency by the amplitude gate. */
export interface AmplitudeGateView {
  /** The envelope percentile under which samples were left out; null = gate off. */
  percentile: number | null;
  excludedSamples: number;
  totalSamples: number;
}

/** The values a scalp map colours by. */
export const SCALP_MAP_MEASURES = ['paf', 'cog', 'deltaF'] as const;
export type ScalpMapMeasure = (typeof SCALP_MAP_MEASURES)[number];

/** Defaults of the analysis-depth settings (see docs/method.md for their reasons). */
export const DEFAULT_AMPLITUDE_GATE_PERCENTILE_WHEN_ON = 25;
export const DEFAULT_CYCLE_DISAGREEMENT_HZ = 0.1;
/** Permutations of the condition difference test and its fixed seed. */
export const CONDITION_PERMUTATIONS = 5000;
export const CONDITION_PERMUTATION_SEED = 20190815;
