import { DEFAULT_POSTERIOR_ROI, normaliseChannelLabel, roiChannels } from '../channels';
import {
  FrequencySlidingWorkspace,
  frequencySliding,
  resolveBandHz,
} from '../frequency/frequency-sliding';
import { DEFAULT_MORLET_CYCLES, DEFAULT_TRANSITION_FRACTION } from '../frequency/spectral-weights';
import {
  cutFrequencyEpochs,
  DataSegmentS,
  DEFAULT_EPOCH_WINDOWS_S,
  epochExceedsAmplitude,
  epochPointCount,
  epochPointRange,
  EpochDropReason,
  screenTrials,
} from '../onset/epochs';
import { onsetCurve, onsetStatistics, trialWindowMeans } from '../onset/onset-statistics';
import {
  channelQuality,
  ChannelQuality,
  lineNoiseRatio,
  medianOf,
  microvoltsPerUnit,
} from '../quality/quality-checks';
import { alphaPeak, centreOfGravity } from '../spectrum/alpha-peak';
import { meanSpectrum, PowerSpectrum, welchPowerSpectrum } from '../spectrum/welch';
import {
  AnalysisOptions,
  AnalysisRecording,
  AnalysisResult,
  AnalysisSignal,
  ChannelResult,
  DropCounts,
  OnsetInput,
  OnsetResult,
  QualityResult,
  ResolvedSettings,
  RestResult,
  RoiResult,
} from './analysis.types';

/** Input that cannot be analysed; `field` names what is wrong. */
export class AnalysisInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'AnalysisInputError';
  }
}

const DEFAULT_ARTEFACT_PATTERN = 'artefact|artifact';

interface Channel {
  signal: AnalysisSignal;
  electrode: string | null;
  inRoi: boolean;
}

/** Resolve every default once, so the result records the settings it was computed with. */
function resolveSettings(
  options: AnalysisOptions,
  kind: 'task' | 'rest',
  onsetCount: number,
): ResolvedSettings {
  return {
    kind,
    bandHz: resolveBandHz(options),
    method: options.method ?? 'plateau',
    transitionFraction: options.transitionFraction ?? DEFAULT_TRANSITION_FRACTION,
    morletCycles: options.morletCycles ?? DEFAULT_MORLET_CYCLES,
    medianWindowsSamples: {},
    epochS: [...(options.epochS ?? DEFAULT_EPOCH_WINDOWS_S.epochS)] as [number, number],
    baselineS: [...(options.baselineS ?? DEFAULT_EPOCH_WINDOWS_S.baselineS)] as [number, number],
    postS: [...(options.postS ?? DEFAULT_EPOCH_WINDOWS_S.postS)] as [number, number],
    edgeGuardS: options.edgeGuardS ?? 1,
    amplitudeLimitUv: options.amplitudeLimitUv ?? 100,
    bootstrapResamples: options.bootstrapResamples ?? 2000,
    bootstrapSeed: options.bootstrapSeed ?? 1,
    slowingThresholdHz: options.slowingThresholdHz ?? -0.2,
    onsetLabel: options.onsetLabel ?? null,
    onsetCount,
    welchSegmentS: options.welchSegmentS ?? 4,
    welchOverlapFraction: options.welchOverlapFraction ?? 0.5,
    alphaSearchHz: [...(options.alphaSearchHz ?? [7, 13])] as [number, number],
    cogBandHz: [...(options.cogBandHz ?? options.alphaSearchHz ?? [7, 13])] as [number, number],
    minPeakProminenceDb: options.minPeakProminenceDb ?? 3,
  };
}

/** Gap-free stretches of the recording and how recording time maps to sample time. */
interface Segment extends DataSegmentS {
  /** Time of the segment's first sample in the concatenated samples, s. */
  dataStartS: number;
}

function dataSegments(recording: AnalysisRecording, durationS: number): Segment[] {
  const starts = recording.recordStartsS;
  const recordS = recording.header?.recordDurationS;
  if (!starts || starts.length === 0 || !recordS) {
    return [{ startS: 0, endS: durationS, dataStartS: 0 }];
  }
  const segments: Segment[] = [];
  let current: Segment = { startS: starts[0], endS: starts[0] + recordS, dataStartS: 0 };
  for (let r = 1; r < starts.length; r++) {
    if (Math.abs(starts[r] - current.endS) > 1e-6) {
      segments.push(current);
      current = { startS: starts[r], endS: starts[r] + recordS, dataStartS: r * recordS };
    } else {
      current.endS = starts[r] + recordS;
    }
  }
  segments.push(current);
  return segments;
}

function toDataTimeS(t: number, segments: readonly Segment[]): number {
  const g = segments.find((s) => t >= s.startS && t < s.endS) ?? segments[0];
  return g.dataStartS + (t - g.startS);
}

function chooseOnsets(
  recording: AnalysisRecording,
  options: AnalysisOptions,
  artefactPattern: RegExp,
): OnsetInput[] {
  let onsets: OnsetInput[] = options.onsets
    ? options.onsets.map((o) => ({ onsetS: o.onsetS, label: o.label }))
    : (recording.annotations ?? [])
        .filter((a) => a.text.trim() !== '' && !artefactPattern.test(a.text))
        .map((a) => ({ onsetS: a.onsetS, label: a.text }));
  const wanted = options.onsetLabel?.trim().toLowerCase();
  if (wanted) onsets = onsets.filter((o) => o.label.trim().toLowerCase() === wanted);
  return onsets.sort((a, b) => a.onsetS - b.onsetS);
}

function countDrops(reasons: readonly (EpochDropReason | null)[]): DropCounts {
  const counts: DropCounts = { edge: 0, amplitude: 0, artefact: 0 };
  for (const r of reasons) if (r) counts[r]++;
  return counts;
}

/**
 * The whole computation for one recording (METHOD.md §2–§4, §6): per channel the
 * frequency sliding on the continuous recording, the epochs around each onset with
 * their rejection reasons, baseline/post/Δf with bootstrap interval and Wilcoxon test,
 * the same over the region of interest, the resting spectrum with PAF and CoG, and the
 * quality checks. Pure and synchronous: the server runs it in a worker thread; results
 * are plain objects and typed arrays. `options.onProgress` receives the share done.
 */
export function analyzeRecording(
  recording: AnalysisRecording,
  options: AnalysisOptions = {},
): AnalysisResult {
  const progress = options.onProgress ?? ((): void => undefined);
  const warnings: string[] = [];
  if (recording.signals.length === 0) {
    throw new AnalysisInputError('signals', 'recording: expected at least one signal, got none');
  }
  for (const s of recording.signals) {
    if (!(s.sampleRateHz > 0)) {
      throw new AnalysisInputError(
        'sampleRateHz',
        `signal "${s.label}": expected a positive sampling rate, got ${s.sampleRateHz} Hz`,
      );
    }
  }
  const durationS =
    recording.durationS ??
    Math.max(...recording.signals.map((s) => s.samples.length / s.sampleRateHz));

  let artefactPattern: RegExp;
  try {
    artefactPattern = new RegExp(options.artefactPattern ?? DEFAULT_ARTEFACT_PATTERN, 'i');
  } catch {
    throw new AnalysisInputError(
      'artefactPattern',
      `artefactPattern: expected a regular expression, got "${options.artefactPattern}"`,
    );
  }
  const onsets = chooseOnsets(recording, options, artefactPattern);
  const kindChoice = options.kind ?? 'auto';
  const kind = kindChoice === 'auto' ? (onsets.length > 0 ? 'task' : 'rest') : kindChoice;
  if (kind === 'task' && onsets.length === 0) {
    const where = options.onsets ? 'the onset list' : 'the annotations';
    const label = options.onsetLabel ? ` labelled "${options.onsetLabel}"` : '';
    throw new AnalysisInputError(
      'onsets',
      `onsets: a task analysis needs stimulus onsets, found none${label} in ${where}`,
    );
  }
  const settings = resolveSettings(options, kind, onsets.length);

  // Channels: the 10-10 scalp electrodes, or every signal when none is recognised.
  let channels: Channel[] = recording.signals.map((signal) => ({
    signal,
    electrode: normaliseChannelLabel(signal.label),
    inRoi: false,
  }));
  if (channels.every((c) => c.electrode === null)) {
    warnings.push('No channel label is a 10-10 electrode: every signal is analysed.');
  } else {
    channels = channels.filter((c) => c.electrode !== null);
  }
  const roiWanted = options.roiLabels ?? DEFAULT_POSTERIOR_ROI;
  const roiFound = roiChannels(
    channels.map((c) => c.signal.label),
    roiWanted,
  );
  for (const r of roiFound) channels[r.index].inRoi = true;
  const foundNames = new Set(roiFound.map((r) => r.canonical));
  const roiMissing = roiWanted.filter(
    (name) => !foundNames.has(normaliseChannelLabel(name) ?? name),
  );
  if (roiFound.length === 0) warnings.push('No channel of the region of interest was found.');

  const segments = dataSegments(recording, durationS);
  if (segments.length > 1) {
    warnings.push(
      `The recording has ${segments.length - 1} gap(s): epochs across a gap are dropped.`,
    );
  }
  const artefacts = (recording.annotations ?? [])
    .filter((a) => artefactPattern.test(a.text))
    .map((a) => ({ startS: a.onsetS, endS: a.onsetS + Math.max(0, a.durationS ?? 0) }));
  const onsetTimes = onsets.map((o) => o.onsetS);
  const trialReasons = screenTrials(onsetTimes, {
    recordingDurationS: durationS,
    segmentsS: segments,
    epochS: settings.epochS,
    edgeGuardS: settings.edgeGuardS,
    artefacts,
  });
  const dataTimes = onsetTimes.map((t) => toDataTimeS(t, segments));

  const qualities: ChannelQuality[] = [];
  const spectra: (PowerSpectrum | null)[] = [];
  const channelResults: ChannelResult[] = [];
  const workspace = new FrequencySlidingWorkspace();
  const roiUsable = (c: Channel, q: ChannelQuality): boolean => c.inRoi && !q.flat && !q.saturated;
  const roiRate = roiFound.length > 0 ? channels[roiFound[0].index].signal.sampleRateHz : null;
  const roiPoints = roiRate ? epochPointCount(settings.epochS, roiRate) : 0;
  const roiSum = new Float64Array(kind === 'task' ? onsets.length * roiPoints : 0);
  const roiCount = new Int32Array(onsets.length);
  const roiChannelLabels: string[] = [];

  channels.forEach((channel, index) => {
    const { signal } = channel;
    const fs = signal.sampleRateHz;
    const basic = channelQuality(signal);
    let spectrum: PowerSpectrum | null = null;
    if (signal.samples.length >= Math.round(settings.welchSegmentS * fs)) {
      spectrum = welchPowerSpectrum(signal.samples, {
        sampleRateHz: fs,
        segmentS: settings.welchSegmentS,
        overlapFraction: settings.welchOverlapFraction,
      });
    }
    const quality: ChannelQuality = {
      ...basic,
      lineNoiseRatio50Hz: spectrum ? lineNoiseRatio(spectrum, 50) : null,
      lineNoiseRatio60Hz: spectrum ? lineNoiseRatio(spectrum, 60) : null,
      phaseSlipShare: null,
    };
    if (channel.inRoi && !roiUsable(channel, quality)) {
      warnings.push(
        `Channel ${signal.label} is ${quality.flat ? 'flat' : 'saturated'}: left out of the region of interest.`,
      );
    }
    if (kind === 'task') {
      const sliding = frequencySliding(
        signal.samples,
        {
          sampleRateHz: fs,
          bandHz: settings.bandHz,
          method: settings.method,
          transitionFraction: settings.transitionFraction,
          morletCycles: settings.morletCycles,
          iafHz: options.iafHz,
        },
        workspace,
      );
      settings.medianWindowsSamples[String(fs)] = sliding.medianWindowsSamples;
      quality.phaseSlipShare = sliding.outOfBandShare;
      const toUv = microvoltsPerUnit(signal.physicalDimension ?? 'uV');
      if (toUv === null && index === 0) {
        warnings.push(`Unknown unit "${signal.physicalDimension}": amplitudes read as µV.`);
      }
      const limit = settings.amplitudeLimitUv / (toUv ?? 1);
      const reasons = trialReasons.map((r, trial) => {
        if (r) return r;
        const exceeds = epochExceedsAmplitude(signal.samples, {
          sampleRateHz: fs,
          onsetS: dataTimes[trial],
          epochS: settings.epochS,
          limit,
        });
        return exceeds ? ('amplitude' as const) : null;
      });
      const kept = reasons.flatMap((r, trial) => (r === null ? [trial] : []));
      const epochs = cutFrequencyEpochs(sliding.frequencyHz, {
        sampleRateHz: fs,
        firstTimeS: sliding.firstTimeS,
        onsetsS: dataTimes,
        epochS: settings.epochS,
      });
      const result = summariseOnsets(epochs, kept, reasons, fs, settings, options);
      channelResults.push({
        label: signal.label,
        electrode: channel.electrode,
        inRoi: channel.inRoi,
        ...result.summary,
      });
      if (roiUsable(channel, quality) && fs === roiRate) {
        roiChannelLabels.push(signal.label);
        for (const trial of kept) {
          roiCount[trial]++;
          const offset = trial * roiPoints;
          for (let i = 0; i < roiPoints; i++) roiSum[offset + i] += epochs[offset + i];
        }
      } else if (roiUsable(channel, quality)) {
        warnings.push(
          `Channel ${signal.label} has another sampling rate: left out of the region of interest.`,
        );
      }
    }
    qualities.push(quality);
    spectra.push(spectrum);
    progress((index + 1) / (channels.length + 1));
  });

  let roi: RoiResult | null = null;
  if (kind === 'task' && roiRate !== null && roiChannelLabels.length > 0) {
    const reasons = trialReasons.map(
      (r, trial) => r ?? (roiCount[trial] > 0 ? null : ('amplitude' as const)),
    );
    const kept = reasons.flatMap((r, trial) => (r === null ? [trial] : []));
    for (const trial of kept) {
      const offset = trial * roiPoints;
      for (let i = 0; i < roiPoints; i++) roiSum[offset + i] /= roiCount[trial];
    }
    const result = summariseOnsets(roiSum, kept, reasons, roiRate, settings, options);
    roi = {
      ...result.summary,
      channels: roiChannelLabels,
      raster: result.raster,
      rasterTrials: kept.length,
      rasterPoints: result.summary.curve.timesS.length,
    };
  }

  // Resting spectrum over the usable region-of-interest channels (all channels if none).
  const roiSpectra = spectra.filter(
    (s, i): s is PowerSpectrum => s !== null && roiUsable(channels[i], qualities[i]),
  );
  const spectrumChannels =
    roiSpectra.length > 0 ? roiSpectra : spectra.filter((s): s is PowerSpectrum => s !== null);
  const spectrumLabels = channels
    .filter(
      (c, i) => spectra[i] !== null && (roiSpectra.length === 0 || roiUsable(c, qualities[i])),
    )
    .map((c) => c.signal.label);
  let restSpectrum: PowerSpectrum | null = null;
  if (spectrumChannels.length > 0) {
    const first = spectrumChannels[0];
    const sameBins = spectrumChannels.filter(
      (s) => s.segmentSamples === first.segmentSamples && s.frequencyHz[1] === first.frequencyHz[1],
    );
    restSpectrum = meanSpectrum(sameBins);
  } else {
    warnings.push('The recording is shorter than one Welch segment: no spectrum.');
  }
  const peak = restSpectrum
    ? alphaPeak(restSpectrum, {
        searchHz: settings.alphaSearchHz,
        minProminenceDb: settings.minPeakProminenceDb,
      })
    : null;
  let rest: RestResult | null = null;
  if (kind === 'rest' && restSpectrum && peak) {
    let bins = 0;
    while (bins < restSpectrum.frequencyHz.length && restSpectrum.frequencyHz[bins] <= 60) bins++;
    rest = {
      pafHz: peak.pafHz,
      cogHz: centreOfGravity(restSpectrum, { bandHz: settings.cogBandHz }),
      prominenceDb: peak.prominenceDb,
      noPeakReason: peak.noPeakReason,
      spectrum: {
        frequencyHz: restSpectrum.frequencyHz.slice(0, bins),
        powerPerHz: restSpectrum.powerPerHz.slice(0, bins),
      },
      channels: spectrumLabels,
    };
  }

  const roiQualities = qualities.filter((q, i) => roiUsable(channels[i], q));
  const slips = roiQualities.map((q) => q.phaseSlipShare).filter((v): v is number => v !== null);
  const qc: QualityResult = {
    durationS,
    sampleRatesHz: [...new Set(channels.map((c) => c.signal.sampleRateHz))],
    roiChannelsFound: roiFound.map((r) => r.label),
    roiChannelsMissing: roiMissing,
    flatChannels: qualities.filter((q) => q.flat).map((q) => q.label),
    saturatedChannels: qualities.filter((q) => q.saturated).map((q) => q.label),
    lineNoiseRatio50Hz: medianOf(
      qualities.map((q) => q.lineNoiseRatio50Hz).filter((v): v is number => v !== null),
    ),
    lineNoiseRatio60Hz: medianOf(
      qualities.map((q) => q.lineNoiseRatio60Hz).filter((v): v is number => v !== null),
    ),
    epochsDroppedShare: roi && onsets.length > 0 ? roi.trialsDropped / onsets.length : null,
    phaseSlipShare: slips.length > 0 ? slips.reduce((a, b) => a + b, 0) / slips.length : null,
    alphaPeakProminenceDb: peak ? peak.prominenceDb : null,
    channels: qualities,
  };
  progress(1);
  return { kind, settings, channels: channelResults, roi, rest, qc, warnings };
}

function summariseOnsets(
  epochs: Float64Array,
  kept: readonly number[],
  reasons: readonly (EpochDropReason | null)[],
  sampleRateHz: number,
  settings: ResolvedSettings,
  options: AnalysisOptions,
): { summary: OnsetResult; raster: Float32Array } {
  const points = epochPointCount(settings.epochS, sampleRateHz);
  const baseline = trialWindowMeans(
    epochs,
    points,
    kept,
    epochPointRange(settings.epochS, sampleRateHz, settings.baselineS),
  );
  const post = trialWindowMeans(
    epochs,
    points,
    kept,
    epochPointRange(settings.epochS, sampleRateHz, settings.postS),
  );
  const stats = onsetStatistics(baseline, post, {
    resamples: settings.bootstrapResamples,
    seed: settings.bootstrapSeed,
    slowingThresholdHz: settings.slowingThresholdHz,
  });
  const curve = onsetCurve(epochs, {
    points,
    trials: kept,
    epochS: settings.epochS,
    sampleRateHz,
    maxPoints: options.maxCurvePoints,
  });
  return {
    summary: {
      ...stats,
      trialsKept: kept.length,
      trialsDropped: reasons.length - kept.length,
      dropReasons: countDrops(reasons),
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
