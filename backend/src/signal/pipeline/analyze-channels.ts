/**
 * The per-channel part of a run: everything that needs a channel's samples and nothing
 * from another channel, so a recording's channels can be analysed in several parts (on
 * several threads) and merged in channel order by `mergeChannelParts` without changing a bit.
 */
import {
  FrequencySlidingWorkspace,
  frequencySlidingInWorkspace,
} from '../frequency/frequency-sliding';
import type { AmplitudeGateCount } from '../frequency/amplitude-gate';
import { ChannelCycleTrials, channelCycleTrials, CycleWorkspace } from '../cycles/channel-cycles';
import { OnsetCurveScratch } from '../trials/onset-statistics';
import {
  cutFrequencyEpochs,
  EpochDropReason,
  epochExceedsAmplitude,
  epochPointCount,
  epochPointRange,
} from '../trials/epochs';
import {
  channelQuality,
  ChannelQuality,
  lineNoiseRatio,
  microvoltsPerUnit,
} from '../quality/quality-checks';
import { PowerSpectrum, welchPowerSpectrum } from '../spectrum/welch';
import { AnalysisInputError } from './analysis-input-error';
import type { AnalysisPlan } from './analysis-plan';
import type { AnalysisSignal, OnsetResult } from './analysis.types';
import { summariseOnsets } from './summarise-onsets';

/** Some channels of a recording: `signals[i]` holds the samples of the plan's channel `channels[i]`. */
export interface RecordingPart {
  channels: readonly number[];
  signals: readonly AnalysisSignal[];
}

/** The kept frequency epochs of one channel, for the region-of-interest sums of the merge. */
export interface KeptEpochs {
  /** The kept trials, ascending. */
  trials: Int32Array;
  /** Points per epoch. */
  points: number;
  /** Kept trials × points, Hz, row-major. */
  valuesHz: Float64Array;
  /** Trials the amplitude gate dropped (no frequency value left in a window), ascending. */
  gatedTrials: Int32Array;
}

/** What one channel contributes to a result. Plain data and typed arrays (transferable). */
export interface ChannelPart {
  /** Index of the channel in the plan. */
  index: number;
  quality: ChannelQuality;
  /** Welch spectrum; null when the channel is shorter than one segment. */
  spectrum: PowerSpectrum | null;
  /** Task runs: the channel's onset statistics; null for a resting run. */
  onsets: OnsetResult | null;
  /** Task runs: the running-median window lengths used, samples. */
  medianWindowsSamples: number[] | null;
  /** Task runs: the channel's unit when Gyre does not know it (amplitudes then read as µV). */
  unknownUnit: string | null;
  /** Task runs, region-of-interest candidates only: the kept epochs. */
  roiEpochs: KeptEpochs | null;
  /** Task runs: what the amplitude gate left out; null when it is off. */
  amplitudeGate: AmplitudeGateCount | null;
  /** Task runs, region-of-interest candidates only: the cycle-by-cycle frequencies of kept trials. */
  cycleTrials: ChannelCycleTrials | null;
}

/**
 * Buffers `analyzeChannels` reuses from channel to channel, and from call to call when the
 * caller keeps it (one batch of channels after another): the analytic signal, the frequency
 * series, the epochs and the curve's scratch of a 60-minute channel are tens of MB, and fresh
 * memory costs a page fault per 4 KiB on first touch. One caller's; never shared between
 * concurrent calls.
 */
export class ChannelAnalysisWorkspace {
  readonly sliding = new FrequencySlidingWorkspace();
  readonly curve = new OnsetCurveScratch();
  /** Shares the frequency sliding's buffers: the cycles run after the epochs are cut. */
  readonly cycles = new CycleWorkspace(this.sliding);
  private epochs = new Float64Array(0);

  epochsFor(length: number): Float64Array {
    if (this.epochs.length < length) this.epochs = new Float64Array(length);
    return this.epochs.subarray(0, length);
  }
}

/**
 * Analyses the channels of `part` as `plan` says (docs/method.md §2, §3, §6): the Welch
 * spectrum (Welch 1967) with the line-noise and flat/saturation checks and, for a task run,
 * the frequency sliding on the continuous recording, each epoch's rejection reason and the
 * channel's baseline/post/Δf statistics. `onChannel` receives the number of channels done.
 */
export function analyzeChannels(
  part: RecordingPart,
  plan: AnalysisPlan,
  options: { onChannel?: (done: number) => void; workspace?: ChannelAnalysisWorkspace } = {},
): ChannelPart[] {
  if (part.channels.length !== part.signals.length) {
    throw new AnalysisInputError(
      'signals',
      `part: ${part.signals.length} signals for ${part.channels.length} channels`,
    );
  }
  const { settings, computation } = plan;
  const workspace = options.workspace ?? new ChannelAnalysisWorkspace();
  return part.channels.map((index, done) => {
    const signal = part.signals[done];
    const planned = plan.channels[index];
    if (
      !planned ||
      planned.label !== signal.label ||
      planned.sampleRateHz !== signal.sampleRateHz
    ) {
      throw new AnalysisInputError(
        'signals',
        `part: signal "${signal.label}" at ${signal.sampleRateHz} Hz found for channel ${index}, ` +
          (planned
            ? `"${planned.label}" at ${planned.sampleRateHz} Hz expected`
            : 'no such channel'),
      );
    }
    const fs = signal.sampleRateHz;
    let spectrum: PowerSpectrum | null = null;
    if (signal.samples.length >= Math.round(computation.welchSegmentS * fs)) {
      spectrum = welchPowerSpectrum(signal.samples, {
        sampleRateHz: fs,
        segmentS: computation.welchSegmentS,
        overlapFraction: computation.welchOverlapFraction,
      });
    }
    const quality: ChannelQuality = {
      ...channelQuality(signal),
      lineNoiseRatio50Hz: spectrum ? lineNoiseRatio(spectrum, 50) : null,
      lineNoiseRatio60Hz: spectrum ? lineNoiseRatio(spectrum, 60) : null,
      phaseSlipShare: null,
    };
    const channel: ChannelPart = {
      index,
      quality,
      spectrum,
      onsets: null,
      medianWindowsSamples: null,
      unknownUnit: null,
      roiEpochs: null,
      amplitudeGate: null,
      cycleTrials: null,
    };
    if (plan.kind === 'task') {
      const sliding = frequencySlidingInWorkspace(
        signal.samples,
        {
          sampleRateHz: fs,
          bandHz: plan.bandHz,
          method: settings.method,
          transitionFraction: computation.transitionFraction,
          morletCycles: settings.morletCycles,
          morletCentreHz: plan.morletCentreHz ?? undefined,
          amplitudeGatePercentile: settings.amplitudeGatePercentile,
        },
        workspace.sliding,
      );
      channel.amplitudeGate = sliding.amplitudeGate;
      channel.medianWindowsSamples = sliding.medianWindowsSamples;
      quality.phaseSlipShare = sliding.outOfBandShare;
      const toUv = microvoltsPerUnit(signal.physicalDimension ?? 'uV');
      if (toUv === null) channel.unknownUnit = String(signal.physicalDimension);
      const limit = settings.rejectionThresholdUv / (toUv ?? 1);
      const reasons = plan.trialReasons.map((r, trial) => {
        if (r) return r;
        const exceeds = epochExceedsAmplitude(signal.samples, {
          sampleRateHz: fs,
          onsetS: plan.dataOnsetsS[trial],
          epochWindowS: settings.epochWindowS,
          limit,
        });
        return exceeds ? ('amplitude' as const) : null;
      });
      const points = epochPointCount(settings.epochWindowS, fs);
      const epochs = cutFrequencyEpochs(
        sliding.frequencyHz,
        {
          sampleRateHz: fs,
          firstTimeS: sliding.firstTimeS,
          onsetsS: plan.dataOnsetsS,
          epochWindowS: settings.epochWindowS,
        },
        workspace.epochsFor(plan.dataOnsetsS.length * points),
      );
      if (sliding.amplitudeGate !== null) {
        dropGatedEpochs(reasons, epochs, points, fs, settings);
      }
      const kept = reasons.flatMap((r, trial) => (r === null ? [trial] : []));
      channel.onsets = summariseOnsets(
        epochs,
        kept,
        reasons,
        fs,
        settings,
        computation,
        workspace.curve,
      ).summary;
      if (planned.roiCandidate) {
        channel.roiEpochs = keptEpochs(epochs, kept, points, reasons);
        channel.cycleTrials = channelCycleTrials(
          signal.samples,
          {
            sampleRateHz: fs,
            bandHz: plan.bandHz,
            transitionFraction: computation.transitionFraction,
            onsetsS: plan.dataOnsetsS,
            trials: kept,
            baselineWindowS: settings.baselineWindowS,
            postWindowS: settings.postWindowS,
          },
          workspace.cycles,
        );
      }
    }
    options.onChannel?.(done + 1);
    return channel;
  });
}

function keptEpochs(
  epochs: Float64Array,
  kept: readonly number[],
  points: number,
  reasons: readonly (EpochDropReason | null)[],
): KeptEpochs {
  const valuesHz = new Float64Array(kept.length * points);
  kept.forEach((trial, k) =>
    valuesHz.set(epochs.subarray(trial * points, (trial + 1) * points), k * points),
  );
  const gated = reasons.flatMap((r, trial) => (r === 'amplitudeGate' ? [trial] : []));
  return { trials: Int32Array.from(kept), points, valuesHz, gatedTrials: Int32Array.from(gated) };
}

/**
 * With the amplitude gate on, a trial whose baseline or post window kept no frequency value
 * has no value to compare: it is dropped with the reason 'amplitudeGate' (in `reasons`).
 */
function dropGatedEpochs(
  reasons: (EpochDropReason | null)[],
  epochs: Float64Array,
  points: number,
  sampleRateHz: number,
  settings: AnalysisPlan['settings'],
): void {
  const windows = [settings.baselineWindowS, settings.postWindowS].map((w) =>
    epochPointRange(settings.epochWindowS, sampleRateHz, w),
  );
  reasons.forEach((reason, trial) => {
    if (reason !== null) return;
    const empty = windows.some(([from, to]) => {
      for (let i = from; i < to; i++) if (!Number.isNaN(epochs[trial * points + i])) return false;
      return true;
    });
    if (empty) reasons[trial] = 'amplitudeGate';
  });
}

/**
 * The buffers of a part's typed arrays that can move to another thread instead of being
 * copied: each once, and only those a typed array covers whole (a view into a larger
 * buffer is copied, so nothing else is detached with it).
 */
export function channelPartBuffers(parts: readonly ChannelPart[]): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  const add = (view: ArrayBufferView | undefined): void => {
    if (
      view &&
      view.buffer instanceof ArrayBuffer &&
      view.byteOffset === 0 &&
      view.byteLength === view.buffer.byteLength
    ) {
      buffers.add(view.buffer);
    }
  };
  for (const part of parts) {
    add(part.spectrum?.frequencyHz);
    add(part.spectrum?.powerPerHz);
    if (part.onsets) {
      const { trialBaselineHz, trialPostHz, curve } = part.onsets;
      for (const view of [trialBaselineHz, trialPostHz, ...Object.values(curve)]) add(view);
    }
    add(part.roiEpochs?.trials);
    add(part.roiEpochs?.valuesHz);
    add(part.roiEpochs?.gatedTrials);
    if (part.cycleTrials) for (const view of Object.values(part.cycleTrials)) add(view);
  }
  return [...buffers];
}
