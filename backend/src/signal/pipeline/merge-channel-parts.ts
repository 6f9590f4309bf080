/**
 * The last step of a run: the channels' parts, in whatever parts they were computed, become
 * one result. Everything that depends on order (the region-of-interest sums and averages,
 * the medians, the warnings) runs here in channel order, so a result never depends on how
 * the channels were split.
 */
import { cycleEstimate } from '../cycles/cycle-estimate';
import type { ChannelCycleTrials } from '../cycles/channel-cycles';
import { medianOf } from '../quality/quality-checks';
import { alphaPeak, centreOfGravity } from '../spectrum/alpha-peak';
import { meanSpectrum, PowerSpectrum } from '../spectrum/welch';
import { epochPointCount } from '../trials/epochs';
import type { AnalysisPlan } from './analysis-plan';
import type { QualityResult } from '../quality/quality-checks';
import { BOOTSTRAP_RESAMPLES, BOOTSTRAP_SEED } from './analysis-settings';
import type {
  AnalysisResult,
  ChannelResult,
  ComputationUsed,
  RestResult,
  RoiResult,
} from './analysis.types';
import type { ChannelPart } from './analyze-channels';
import { decideRoiUsage } from './roi-usage';
import { summariseConditions } from './summarise-conditions';
import { summariseOnsets } from './summarise-onsets';

/**
 * One result from the parts of a run (docs/method.md §3, §4, §6): the region of interest
 * from the channels `decideRoiUsage` keeps, averaged trial by trial in channel order; the
 * resting spectrum (mean of the region's Welch spectra) with PAF and CoG; the quality
 * summary. Every channel of the plan must be in exactly one part.
 */
export function mergeChannelParts(
  plan: AnalysisPlan,
  parts: readonly (readonly ChannelPart[])[],
): AnalysisResult {
  const { kind, settings, computation } = plan;
  const byChannel = inChannelOrder(plan, parts);
  const warnings = [...plan.warnings.channels];
  const qualities = byChannel.map((c) => c.quality);
  const spectra = byChannel.map((c) => c.spectrum);
  const roiDecision = decideRoiUsage(
    settings.roi,
    plan.channels.map((c, i) => ({
      label: c.label,
      sampleRateHz: c.sampleRateHz,
      flat: qualities[i].flat,
      saturated: qualities[i].saturated,
    })),
  );
  warnings.push(...roiDecision.warnings);
  warnings.push(...plan.warnings.gaps);
  const inRoi = (index: number): boolean => roiDecision.used.has(index);

  const onsetCount = plan.onsetsS.length;
  const used: ComputationUsed = {
    ...computation,
    morletCentreHz: plan.morletCentreHz,
    bootstrapResamples: BOOTSTRAP_RESAMPLES,
    bootstrapSeed: BOOTSTRAP_SEED,
    medianWindowsSamples: {},
    onsetCount,
  };
  const channelResults: ChannelResult[] = [];
  const roiRate = roiDecision.sampleRateHz;
  const roiPoints = roiRate ? epochPointCount(settings.epochWindowS, roiRate) : 0;
  const roiSum = new Float64Array(kind === 'task' ? onsetCount * roiPoints : 0);
  const roiCount = new Int32Array(onsetCount);
  // Amplitude gate on: NaN (gated) points are left out point by point, and a trial every
  // region channel dropped for the gate keeps that reason.
  const gated = settings.amplitudeGatePercentile !== null;
  const roiPointCount = new Int32Array(gated ? roiSum.length : 0);
  const roiGatedCount = new Int32Array(onsetCount);
  let roiChannelCount = 0;
  const roiCycles: ChannelCycleTrials[] = [];
  if (kind === 'task') {
    let unknownUnitWarned = false;
    byChannel.forEach((part, index) => {
      const channel = plan.channels[index];
      if (part.onsets === null || part.medianWindowsSamples === null) {
        throw new Error(`channel ${channel.label}: a task run's part holds no onset results`);
      }
      used.medianWindowsSamples[String(channel.sampleRateHz)] = part.medianWindowsSamples;
      if (part.unknownUnit !== null && !unknownUnitWarned) {
        unknownUnitWarned = true;
        warnings.push(`Unknown unit "${part.unknownUnit}": amplitudes read as µV.`);
      }
      channelResults.push({
        label: channel.label,
        electrode: channel.electrode,
        inRoi: inRoi(index),
        ...part.onsets,
        amplitudeGate: part.amplitudeGate,
      });
      if (inRoi(index)) {
        const epochs = part.roiEpochs;
        if (epochs === null || epochs.points !== roiPoints) {
          throw new Error(`channel ${channel.label}: its region-of-interest epochs are missing`);
        }
        epochs.trials.forEach((trial, k) => {
          roiCount[trial]++;
          const offset = trial * roiPoints;
          const row = k * roiPoints;
          if (!gated) {
            for (let i = 0; i < roiPoints; i++) roiSum[offset + i] += epochs.valuesHz[row + i];
            return;
          }
          for (let i = 0; i < roiPoints; i++) {
            const v = epochs.valuesHz[row + i];
            if (Number.isNaN(v)) continue;
            roiSum[offset + i] += v;
            roiPointCount[offset + i]++;
          }
        });
        for (const trial of epochs.gatedTrials) roiGatedCount[trial]++;
        roiChannelCount++;
        if (part.cycleTrials !== null) roiCycles.push(part.cycleTrials);
      }
    });
  }

  let roi: RoiResult | null = null;
  let cycles: AnalysisResult['cycles'] = null;
  if (kind === 'task' && roiRate !== null) {
    const reasons = plan.trialReasons.map((r, trial) => {
      if (r !== null || roiCount[trial] > 0) return r;
      return roiGatedCount[trial] === roiChannelCount ? 'amplitudeGate' : 'amplitude';
    });
    const kept = reasons.flatMap((r, trial) => (r === null ? [trial] : []));
    for (const trial of kept) {
      const offset = trial * roiPoints;
      if (!gated) {
        for (let i = 0; i < roiPoints; i++) roiSum[offset + i] /= roiCount[trial];
        continue;
      }
      for (let i = offset; i < offset + roiPoints; i++) {
        roiSum[i] = roiPointCount[i] > 0 ? roiSum[i] / roiPointCount[i] : NaN;
      }
    }
    const result = summariseOnsets(roiSum, kept, reasons, roiRate, settings, computation);
    const byCondition = summariseConditions(
      roiSum,
      reasons,
      plan.onsetLabels,
      roiRate,
      settings,
      computation,
      plan.requestedConditions,
    );
    warnings.push(...byCondition.warnings);
    roi = {
      ...result.summary,
      channels: [...roiDecision.usage.used],
      trialOnsetsS: kept.map((trial) => plan.onsetsS[trial]),
      raster: result.raster,
      rasterTrials: kept.length,
      rasterPoints: result.summary.curve.timesS.length,
      conditions: byCondition.conditions,
      conditionDifference: byCondition.difference,
    };
    cycles = cycleEstimate(roiCycles, {
      trials: kept,
      phaseDeltaFHz: result.summary.deltaFHz,
      disagreementHz: settings.cycleDisagreementHz,
      resamples: BOOTSTRAP_RESAMPLES,
      seed: BOOTSTRAP_SEED,
    });
    if (cycles.disagrees && cycles.disagreementHz !== null) {
      warnings.push(
        `The cycle-by-cycle Δf differs from the phase-based Δf by ${cycles.disagreementHz.toFixed(2)} Hz ` +
          `(more than ${settings.cycleDisagreementHz} Hz): the rhythm may not be sinusoidal enough ` +
          'for the phase-based estimate.',
      );
    }
  }

  // The resting spectrum averages the region's channels only: never a silent fallback.
  const roiIndices = plan.channels.flatMap((_, i) => (inRoi(i) && spectra[i] !== null ? [i] : []));
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
      channels: roiIndices.map((i) => plan.channels[i].label),
      channelPeaks: plan.channels.map((c, i) => channelPeak(c.label, spectra[i], computation)),
    };
  }

  const roiQualities = qualities.filter((_, i) => inRoi(i));
  const slips = roiQualities.map((q) => q.phaseSlipShare).filter((v): v is number => v !== null);
  const qc: QualityResult = {
    durationS: plan.durationS,
    sampleRatesHz: [...new Set(plan.channels.map((c) => c.sampleRateHz))],
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
    epochsDroppedShare: roi && onsetCount > 0 ? roi.trialsDropped / onsetCount : null,
    phaseSlipShare: slips.length > 0 ? slips.reduce((a, b) => a + b, 0) / slips.length : null,
    alphaPeakProminenceDb: peak ? peak.prominenceDb : null,
    channels: qualities,
  };
  return {
    kind,
    settings,
    iafHz: plan.iafHz,
    bandHz: plan.bandHz,
    bandSource: plan.bandSource,
    computation: used,
    roiUsage: roiDecision.usage,
    channels: channelResults,
    roi,
    rest,
    cycles,
    qc,
    warnings,
  };
}

/** One channel's own PAF and CoG, by the same peak and CoG code as the region's mean spectrum. */
function channelPeak(
  label: string,
  spectrum: PowerSpectrum | null,
  computation: AnalysisPlan['computation'],
): RestResult['channelPeaks'][number] {
  if (spectrum === null) return { label, pafHz: null, cogHz: null };
  const peak = alphaPeak(spectrum, {
    searchHz: computation.alphaSearchHz,
    minProminenceDb: computation.minPeakProminenceDb,
  });
  return {
    label,
    pafHz: peak.pafHz,
    cogHz: centreOfGravity(spectrum, { bandHz: computation.cogBandHz }),
  };
}

/** The channels' parts by channel index; every planned channel exactly once. */
function inChannelOrder(
  plan: AnalysisPlan,
  parts: readonly (readonly ChannelPart[])[],
): ChannelPart[] {
  const byChannel: (ChannelPart | undefined)[] = plan.channels.map(() => undefined);
  for (const part of parts) {
    for (const channel of part) {
      if (!(channel.index >= 0 && channel.index < byChannel.length)) {
        throw new Error(`parts: channel ${channel.index} is not in the plan`);
      }
      if (byChannel[channel.index] !== undefined) {
        throw new Error(`parts: channel ${plan.channels[channel.index].label} came twice`);
      }
      byChannel[channel.index] = channel;
    }
  }
  const missing = plan.channels.filter((_, i) => byChannel[i] === undefined).map((c) => c.label);
  if (missing.length > 0) throw new Error(`parts: no result for ${missing.join(', ')}`);
  return byChannel as ChannelPart[];
}
