import type { AnalysisComputationOptions } from './analysis-computation';
import { outlineOf, planAnalysis } from './analysis-plan';
import type { AnalysisSettings } from './analysis-settings';
import type { AnalysisContext, AnalysisRecording, AnalysisResult } from './analysis.types';
import { analyzeChannels } from './analyze-channels';
import { mergeChannelParts } from './merge-channel-parts';

export { AnalysisInputError } from './analysis-input-error';

/**
 * The whole computation for one recording (docs/method.md §2–§4, §6): per channel the
 * frequency sliding on the continuous recording, the epochs around each onset with
 * their rejection reasons, baseline/post/Δf with bootstrap interval (Efron & Tibshirani
 * 1993) and Wilcoxon test, the same over the region of interest, the resting spectrum
 * (Welch 1967) with PAF and CoG, and the quality checks.
 *
 * The band comes only from `resolveAnalysisBand(settings, context.iafHz)`; the Morlet
 * wavelet is centred on the IAF when known, else on the band centre; the bootstrap always
 * uses `BOOTSTRAP_SEED` and `BOOTSTRAP_RESAMPLES`. The region-of-interest result averages
 * only the channels `decideRoiUsage` keeps; with none there is no region number at all.
 * Pure and synchronous: the plan (`planAnalysis`), every channel as one part
 * (`analyzeChannels`) and the merge (`mergeChannelParts`); the server runs the same steps
 * with the channels in several parts on several threads, with the same numbers to the bit.
 * `context.onProgress` receives the share done.
 */
export function analyzeRecording(
  recording: AnalysisRecording,
  settings: Readonly<AnalysisSettings>,
  context: AnalysisContext,
  computationOptions: AnalysisComputationOptions = {},
): AnalysisResult {
  const progress = context.onProgress ?? ((): void => undefined);
  const plan = planAnalysis(outlineOf(recording), settings, context, computationOptions);
  const part = analyzeChannels(
    {
      channels: plan.channels.map((_, index) => index),
      signals: plan.channels.map((c) => recording.signals[c.signalIndex]),
    },
    plan,
    { onChannel: (done) => progress(done / (plan.channels.length + 1)) },
  );
  const result = mergeChannelParts(plan, [part]);
  progress(1);
  return result;
}
