import { epochPointCount, epochPointRange, EpochDropReason } from '../trials/epochs';
import {
  onsetCurve,
  OnsetCurveScratch,
  onsetStatistics,
  trialWindowMeans,
} from '../trials/onset-statistics';
import type { AnalysisComputation } from './analysis-computation';
import { AnalysisSettings, BOOTSTRAP_RESAMPLES, BOOTSTRAP_SEED } from './analysis-settings';
import type { DropCounts, OnsetResult } from './analysis.types';

/**
 * Baseline, post and Δf over the kept trials of frequency epochs (trials × points) with
 * the bootstrap interval (Efron & Tibshirani 1993) and the Wilcoxon test, the mean curve
 * and the raster (docs/method.md §3): one channel's or the region of interest's. With
 * `scratch` the raster is a view of its buffer (see `onsetCurve`).
 */
export function summariseOnsets(
  epochs: Float64Array,
  kept: readonly number[],
  reasons: readonly (EpochDropReason | null)[],
  sampleRateHz: number,
  settings: Readonly<AnalysisSettings>,
  computation: AnalysisComputation,
  scratch?: OnsetCurveScratch,
): { summary: OnsetResult; raster: Float32Array } {
  const { epochWindowS } = settings;
  const points = epochPointCount(epochWindowS, sampleRateHz);
  const baseline = trialWindowMeans(
    epochs,
    points,
    kept,
    epochPointRange(epochWindowS, sampleRateHz, settings.baselineWindowS),
  );
  const post = trialWindowMeans(
    epochs,
    points,
    kept,
    epochPointRange(epochWindowS, sampleRateHz, settings.postWindowS),
  );
  const stats = onsetStatistics(baseline, post, {
    resamples: BOOTSTRAP_RESAMPLES,
    seed: BOOTSTRAP_SEED,
    flagThresholdHz: settings.flagThresholdHz,
  });
  const curve = onsetCurve(
    epochs,
    { points, trials: kept, epochWindowS, sampleRateHz, maxPoints: computation.maxCurvePoints },
    scratch,
  );
  return {
    summary: {
      ...stats,
      trialsKept: kept.length,
      trialsDropped: reasons.length - kept.length,
      dropReasons: countDrops(reasons, settings.amplitudeGatePercentile !== null),
      trialBaselineHz: baseline,
      trialPostHz: post,
      curve: {
        timesS: curve.timesS,
        meanHz: curve.meanHz,
        lowerHz: curve.lowerHz,
        upperHz: curve.upperHz,
      },
    },
    raster: curve.raster,
  };
}

function countDrops(reasons: readonly (EpochDropReason | null)[], gated: boolean): DropCounts {
  const counts: DropCounts = { edge: 0, amplitude: 0, artefact: 0 };
  if (gated) counts.amplitudeGate = 0;
  for (const r of reasons) if (r) counts[r] = (counts[r] ?? 0) + 1;
  return counts;
}
