import { normaliseChannelLabel } from '../channels';
import { FrequencySlidingWorkspace, frequencySliding } from '../frequency/frequency-sliding';
import {
  cutFrequencyEpochs,
  DataSegmentS,
  epochExceedsAmplitude,
  epochPointCount,
  epochPointRange,
  EpochDropReason,
  screenTrials,
} from '../onset/epochs';
import { onsetCurve, onsetStatistics, trialWindowMeans } from '../onset/onset-statistics';
import { artefactRegExp, stimulusAnnotations } from '../onsets/stimulus-annotations';
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
  AnalysisComputation,
  AnalysisComputationOptions,
  resolveComputation,
} from './analysis-computation';
import {
  AnalysisSettings,
  BOOTSTRAP_RESAMPLES,
  BOOTSTRAP_SEED,
  copyAnalysisSettings,
  resolveAnalysisBand,
} from './analysis-settings';
import {
  AnalysisContext,
  AnalysisRecording,
  AnalysisResult,
  AnalysisSignal,
  ChannelResult,
  ComputationUsed,
  DropCounts,
  OnsetInput,
  OnsetResult,
  QualityResult,
  RestResult,
  RoiResult,
} from './analysis.types';
import { decideRoiUsage } from './roi-usage';

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

interface Channel {
  signal: AnalysisSignal;
  electrode: string | null;
}

const isPair = (v: unknown): v is [number, number] =>
  Array.isArray(v) && v.length === 2 && v.every((x) => typeof x === 'number' && Number.isFinite(x));

/**
 * Settings the computation cannot run with. The server validates settings when they are
 * saved; this catches what reaches the core by another way (command line, tests).
 */
function checkSettings(settings: Readonly<AnalysisSettings>, iafHz: number | null): void {
  const fail = (field: string, found: string, expected: string): never => {
    throw new AnalysisInputError(field, `${field}: ${found} found, ${expected} expected`);
  };
  const text = (v: unknown): string => JSON.stringify(v) ?? String(v);
  if (settings.bandHz !== null) {
    const b = settings.bandHz;
    if (!isPair(b) || !(b[0] > 0 && b[1] > b[0]))
      fail('bandHz', text(b), '[low, high] with 0 < low < high');
  }
  if (settings.method !== 'filter' && settings.method !== 'morlet') {
    fail('method', text(settings.method), '"filter" or "morlet"');
  }
  if (!(settings.morletCycles > 0))
    fail('morletCycles', text(settings.morletCycles), 'a positive number');
  for (const field of ['epochWindowS', 'baselineWindowS', 'postWindowS'] as const) {
    const w = settings[field];
    if (!isPair(w) || !(w[1] > w[0])) fail(field, text(w), '[start, end] with start < end, s');
  }
  const [e0, e1] = settings.epochWindowS;
  for (const field of ['baselineWindowS', 'postWindowS'] as const) {
    const w = settings[field];
    if (w[0] < e0 || w[1] > e1)
      fail(field, text(w), `a window inside the epoch ${text(settings.epochWindowS)}`);
  }
  if (!(settings.rejectionThresholdUv > 0)) {
    fail('rejectionThresholdUv', text(settings.rejectionThresholdUv), 'a positive number of µV');
  }
  if (!Number.isFinite(settings.flagThresholdHz)) {
    fail('flagThresholdHz', text(settings.flagThresholdHz), 'a number of Hz');
  }
  if (!Array.isArray(settings.roi) || settings.roi.some((n) => typeof n !== 'string')) {
    fail('roi', text(settings.roi), 'a list of 10-10 channel names');
  }
  if (iafHz !== null && !(Number.isFinite(iafHz) && iafHz > 0)) {
    fail('iafHz', text(iafHz), 'a positive frequency in Hz or null');
  }
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
  onsetLabel: string | null,
  given: readonly OnsetInput[] | undefined,
  artefactPattern: RegExp,
): OnsetInput[] {
  let onsets: OnsetInput[] = given
    ? given.map((o) => ({ onsetS: o.onsetS, label: o.label }))
    : stimulusAnnotations(recording.annotations ?? [], artefactPattern).map((a) => ({
        onsetS: a.onsetS,
        label: a.text,
      }));
  const wanted = onsetLabel?.trim().toLowerCase();
  if (wanted) onsets = onsets.filter((o) => o.label.trim().toLowerCase() === wanted);
  return onsets.sort((a, b) => a.onsetS - b.onsetS);
}

function countDrops(reasons: readonly (EpochDropReason | null)[]): DropCounts {
  const counts: DropCounts = { edge: 0, amplitude: 0, artefact: 0 };
  for (const r of reasons) if (r) counts[r]++;
  return counts;
}

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
 * Pure and synchronous: the server runs it in a worker thread; results are plain objects
 * and typed arrays. `context.onProgress` receives the share done.
 */
export function analyzeRecording(
  recording: AnalysisRecording,
  settingsIn: Readonly<AnalysisSettings>,
  context: AnalysisContext,
  computationOptions: AnalysisComputationOptions = {},
): AnalysisResult {
  const progress = context.onProgress ?? ((): void => undefined);
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
  const iafHz = context.iafHz;
  checkSettings(settingsIn, iafHz);
  const settings = copyAnalysisSettings(settingsIn);
  const computation = resolveComputation(computationOptions);
  const durationS =
    recording.durationS ??
    Math.max(...recording.signals.map((s) => s.samples.length / s.sampleRateHz));

  const artefactPattern = artefactRegExp(computation.artefactPattern);
  if (artefactPattern === null) {
    throw new AnalysisInputError(
      'artefactPattern',
      `artefactPattern: expected a regular expression, got "${computation.artefactPattern}"`,
    );
  }
  const onsets = chooseOnsets(recording, settings.onsetLabel, context.onsets, artefactPattern);
  const kind = context.kind === 'auto' ? (onsets.length > 0 ? 'task' : 'rest') : context.kind;
  if (kind === 'task' && onsets.length === 0) {
    const where = context.onsets ? 'the onset list' : 'the annotations';
    const label = settings.onsetLabel ? ` labelled "${settings.onsetLabel}"` : '';
    throw new AnalysisInputError(
      'onsets',
      `onsets: a task analysis needs stimulus onsets, found none${label} in ${where}`,
    );
  }
  const { bandHz, bandSource } = resolveAnalysisBand(settings, iafHz);
  const iafKnown = iafHz !== null && Number.isFinite(iafHz);
  const used: ComputationUsed = {
    ...computation,
    morletCentreHz:
      settings.method === 'morlet' ? (iafKnown ? iafHz : (bandHz[0] + bandHz[1]) / 2) : null,
    bootstrapResamples: BOOTSTRAP_RESAMPLES,
    bootstrapSeed: BOOTSTRAP_SEED,
    medianWindowsSamples: {},
    onsetCount: onsets.length,
  };

  // Channels: the 10-10 scalp electrodes, or every signal when none is recognised.
  let channels: Channel[] = recording.signals.map((signal) => ({
    signal,
    electrode: normaliseChannelLabel(signal.label),
  }));
  if (channels.every((c) => c.electrode === null)) {
    warnings.push('No channel label is a 10-10 electrode: every signal is analysed.');
  } else {
    channels = channels.filter((c) => c.electrode !== null);
  }
  // Flat and saturation checks first: they decide the region before any channel is averaged.
  const basics = channels.map((c) => channelQuality(c.signal));
  const roiDecision = decideRoiUsage(
    settings.roi,
    channels.map((c, i) => ({
      label: c.signal.label,
      sampleRateHz: c.signal.sampleRateHz,
      flat: basics[i].flat,
      saturated: basics[i].saturated,
    })),
  );
  warnings.push(...roiDecision.warnings);
  const inRoi = (index: number): boolean => roiDecision.used.has(index);

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
    epochWindowS: settings.epochWindowS,
    edgeGuardS: computation.edgeGuardS,
    artefacts,
  });
  const dataTimes = onsetTimes.map((t) => toDataTimeS(t, segments));

  const qualities: ChannelQuality[] = [];
  const spectra: (PowerSpectrum | null)[] = [];
  const channelResults: ChannelResult[] = [];
  const workspace = new FrequencySlidingWorkspace();
  const roiRate = roiDecision.sampleRateHz;
  const roiPoints = roiRate ? epochPointCount(settings.epochWindowS, roiRate) : 0;
  const roiSum = new Float64Array(kind === 'task' ? onsets.length * roiPoints : 0);
  const roiCount = new Int32Array(onsets.length);
  let unknownUnitWarned = false;

  channels.forEach((channel, index) => {
    const { signal } = channel;
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
      ...basics[index],
      lineNoiseRatio50Hz: spectrum ? lineNoiseRatio(spectrum, 50) : null,
      lineNoiseRatio60Hz: spectrum ? lineNoiseRatio(spectrum, 60) : null,
      phaseSlipShare: null,
    };
    if (kind === 'task') {
      const sliding = frequencySliding(
        signal.samples,
        {
          sampleRateHz: fs,
          bandHz,
          method: settings.method,
          transitionFraction: computation.transitionFraction,
          morletCycles: settings.morletCycles,
          morletCentreHz: used.morletCentreHz ?? undefined,
        },
        workspace,
      );
      used.medianWindowsSamples[String(fs)] = sliding.medianWindowsSamples;
      quality.phaseSlipShare = sliding.outOfBandShare;
      const toUv = microvoltsPerUnit(signal.physicalDimension ?? 'uV');
      if (toUv === null && !unknownUnitWarned) {
        unknownUnitWarned = true;
        warnings.push(`Unknown unit "${signal.physicalDimension}": amplitudes read as µV.`);
      }
      const limit = settings.rejectionThresholdUv / (toUv ?? 1);
      const reasons = trialReasons.map((r, trial) => {
        if (r) return r;
        const exceeds = epochExceedsAmplitude(signal.samples, {
          sampleRateHz: fs,
          onsetS: dataTimes[trial],
          epochWindowS: settings.epochWindowS,
          limit,
        });
        return exceeds ? ('amplitude' as const) : null;
      });
      const kept = reasons.flatMap((r, trial) => (r === null ? [trial] : []));
      const epochs = cutFrequencyEpochs(sliding.frequencyHz, {
        sampleRateHz: fs,
        firstTimeS: sliding.firstTimeS,
        onsetsS: dataTimes,
        epochWindowS: settings.epochWindowS,
      });
      const result = summariseOnsets(epochs, kept, reasons, fs, settings, computation);
      channelResults.push({
        label: signal.label,
        electrode: channel.electrode,
        inRoi: inRoi(index),
        ...result.summary,
      });
      if (inRoi(index)) {
        for (const trial of kept) {
          roiCount[trial]++;
          const offset = trial * roiPoints;
          for (let i = 0; i < roiPoints; i++) roiSum[offset + i] += epochs[offset + i];
        }
      }
    }
    qualities.push(quality);
    spectra.push(spectrum);
    progress((index + 1) / (channels.length + 1));
  });

  let roi: RoiResult | null = null;
  if (kind === 'task' && roiRate !== null) {
    const reasons = trialReasons.map(
      (r, trial) => r ?? (roiCount[trial] > 0 ? null : ('amplitude' as const)),
    );
    const kept = reasons.flatMap((r, trial) => (r === null ? [trial] : []));
    for (const trial of kept) {
      const offset = trial * roiPoints;
      for (let i = 0; i < roiPoints; i++) roiSum[offset + i] /= roiCount[trial];
    }
    const result = summariseOnsets(roiSum, kept, reasons, roiRate, settings, computation);
    roi = {
      ...result.summary,
      channels: [...roiDecision.usage.used],
      trialOnsetsS: kept.map((trial) => onsetTimes[trial]),
      raster: result.raster,
      rasterTrials: kept.length,
      rasterPoints: result.summary.curve.timesS.length,
    };
  }

  // The resting spectrum averages the region's channels only: never a silent fallback.
  const roiIndices = channels.flatMap((_, i) => (inRoi(i) && spectra[i] !== null ? [i] : []));
  let restSpectrum: PowerSpectrum | null = null;
  if (roiIndices.length > 0) {
    restSpectrum = meanSpectrum(roiIndices.map((i) => spectra[i] as PowerSpectrum));
  } else if (roiRate !== null) {
    warnings.push('The recording is shorter than one Welch segment: no spectrum.');
  }
  const peak = restSpectrum
    ? alphaPeak(restSpectrum, {
        searchHz: computation.alphaSearchHz,
        minProminenceDb: computation.minPeakProminenceDb,
      })
    : null;
  let rest: RestResult | null = null;
  if (kind === 'rest' && restSpectrum && peak) {
    let bins = 0;
    while (bins < restSpectrum.frequencyHz.length && restSpectrum.frequencyHz[bins] <= 60) bins++;
    rest = {
      pafHz: peak.pafHz,
      cogHz: centreOfGravity(restSpectrum, { bandHz: computation.cogBandHz }),
      prominenceDb: peak.prominenceDb,
      noPeakReason: peak.noPeakReason,
      spectrum: {
        frequencyHz: restSpectrum.frequencyHz.slice(0, bins),
        powerPerHz: restSpectrum.powerPerHz.slice(0, bins),
      },
      channels: roiIndices.map((i) => channels[i].signal.label),
    };
  }

  const roiQualities = qualities.filter((_, i) => inRoi(i));
  const slips = roiQualities.map((q) => q.phaseSlipShare).filter((v): v is number => v !== null);
  const qc: QualityResult = {
    durationS,
    sampleRatesHz: [...new Set(channels.map((c) => c.signal.sampleRateHz))],
    roiChannelsFound: roiDecision.found,
    roiChannelsMissing: roiDecision.usage.leftOut
      .filter((o) => o.reason === 'missing')
      .map((o) => o.label),
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
  return {
    kind,
    settings,
    iafHz,
    bandHz,
    bandSource,
    computation: used,
    roiUsage: roiDecision.usage,
    channels: channelResults,
    roi,
    rest,
    qc,
    warnings,
  };
}

function summariseOnsets(
  epochs: Float64Array,
  kept: readonly number[],
  reasons: readonly (EpochDropReason | null)[],
  sampleRateHz: number,
  settings: Readonly<AnalysisSettings>,
  computation: AnalysisComputation,
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
  const curve = onsetCurve(epochs, {
    points,
    trials: kept,
    epochWindowS,
    sampleRateHz,
    maxPoints: computation.maxCurvePoints,
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
