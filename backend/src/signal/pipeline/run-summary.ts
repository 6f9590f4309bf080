/**
 * The one shape of a run's results, owned by the signal core: the worker stores it, the
 * command line prints it. Plain data and Float64Arrays only, so it crosses a thread boundary
 * by structured clone (series by transfer).
 */
import type {
  ChannelStatsView,
  ConditionDifferenceView,
  ConditionStatsView,
  CycleEstimateView,
  QualityView,
  RoiUsageView,
} from '@gyre/shared';
import type { AnalysisBandSource } from './analysis-settings';
import type { AnalysisResult, OnsetResult } from './analysis.types';

/**
 * Named numeric series of one run: `timeS`, `roi:mean|ciLow|ciHigh`,
 * `channel:<label>:mean|ciLow|ciHigh`, `condition:<label>:mean|ciLow|ciHigh`,
 * `raster:timeS`, `raster` (trials × points,
 * row-major), `trialDeltaFHz`, `rest:frequencyHz`, `rest:powerUv2PerHz`. NaN stands for
 * "no value".
 */
export type ResultSeries = Record<string, Float64Array>;

/** The small, JSON-friendly part of a run's results. */
export interface RunSummary {
  /** The band the run used and where it came from (`resolveAnalysisBand`). */
  bandHz: [number, number];
  bandSource: AnalysisBandSource;
  /** Which region-of-interest channels the numbers come from, and why others were left out. */
  roiUsage: RoiUsageView;
  channels: ChannelStatsView[];
  /** Task recordings: the region of interest's statistics over trials; null without a region. */
  roi: {
    baselineHz: number | null;
    postHz: number | null;
    deltaFHz: number | null;
    ciHz: [number, number] | null;
    pValue: number | null;
    trialsKept: number;
    trialsTotal: number;
  } | null;
  task: {
    baselineWindowS: [number, number];
    postWindowS: [number, number];
    epochs: { total: number; kept: number; dropped: Record<string, number> };
    /** Onset of each raster row (kept trial), s from the recording start. */
    trialOnsetsS: number[];
    /** Names of the per-channel curves in `series` (`channel:<label>:mean|ciLow|ciHigh`). */
    curveChannels: string[];
    rasterTrials: number;
    rasterPoints: number;
    /** The region's statistics per condition (onset label); [] in runs stored before them. */
    conditions: ConditionStatsView[];
    /** Δf(first) − Δf(second) of two conditions; null (or absent in older runs) without one. */
    conditionDifference: ConditionDifferenceView | null;
    /** Labels whose curves are in `series` (`condition:<label>:mean|ciLow|ciHigh`). */
    conditionCurves: string[];
    /** The region's cycle-by-cycle Δf beside the phase-based one; null (or absent in older runs) without one. */
    cycles: CycleEstimateView | null;
  } | null;
  /** Resting recordings: null when no region-of-interest channel remains. */
  rest: {
    pafHz: number | null;
    cogHz: number | null;
    prominenceDb: number | null;
    noPeakReason: string | null;
    alphaWindowHz: [number, number];
  } | null;
  quality: QualityView;
  suggestsSlowing: boolean | null;
}

export interface AnalyzeOutcome {
  summary: RunSummary;
  series: ResultSeries;
}

const copy = (values: ArrayLike<number>): Float64Array => Float64Array.from(values);

/**
 * Curves stored for at most this many conditions (the first with kept trials): labels that
 * differ per onset ("stim 1", "stim 2", …) must not multiply a run's series.
 */
const MAX_CONDITION_CURVES = 32;

/**
 * A result in Gyre's stored shape. Every series is a fresh Float64Array, so each has its own
 * buffer to transfer; `readerWarnings` (the EDF reader's) come first in the quality warnings.
 */
export function toAnalyzeOutcome(
  result: AnalysisResult,
  readerWarnings: readonly string[],
): AnalyzeOutcome {
  const series: ResultSeries = {};
  let task: RunSummary['task'] = null;
  let roi: RunSummary['roi'] = null;
  const curveChannels: string[] = [];
  const conditionCurves: string[] = [];
  if (result.kind === 'task' && result.roi !== null) {
    const r = result.roi;
    series.timeS = copy(r.curve.timesS);
    putCurve(series, 'roi', r);
    for (const channel of result.channels) {
      if (channel.curve.meanHz.length === 0) continue;
      putCurve(series, `channel:${channel.label}`, channel);
      curveChannels.push(channel.label);
    }
    for (const condition of r.conditions) {
      if (condition.trialsKept === 0 || conditionCurves.length >= MAX_CONDITION_CURVES) continue;
      putCurve(series, `condition:${condition.label}`, condition);
      conditionCurves.push(condition.label);
    }
    series['raster:timeS'] =
      r.rasterPoints === r.curve.timesS.length
        ? copy(r.curve.timesS)
        : evenlySpaced(result.settings.epochWindowS, r.rasterPoints);
    series.raster = copy(r.raster);
    series.trialDeltaFHz = Float64Array.from(
      r.trialPostHz,
      (post, i) => post - r.trialBaselineHz[i],
    );
    roi = {
      baselineHz: r.baselineHz,
      postHz: r.postHz,
      deltaFHz: r.deltaFHz,
      ciHz: r.ciHz,
      pValue: r.pValue,
      trialsKept: r.trialsKept,
      trialsTotal: r.trialsKept + r.trialsDropped,
    };
    task = {
      baselineWindowS: [...result.settings.baselineWindowS],
      postWindowS: [...result.settings.postWindowS],
      epochs: {
        total: r.trialsKept + r.trialsDropped,
        kept: r.trialsKept,
        dropped: { ...r.dropReasons },
      },
      trialOnsetsS: [...r.trialOnsetsS],
      curveChannels,
      rasterTrials: r.rasterTrials,
      rasterPoints: r.rasterPoints,
      conditions: r.conditions.map((c) => ({
        label: c.label,
        trialsKept: c.trialsKept,
        trialsTotal: c.trialsTotal,
        baselineHz: c.baselineHz,
        postHz: c.postHz,
        deltaFHz: c.deltaFHz,
        ciHz: c.ciHz,
        pValue: c.pValue,
      })),
      conditionDifference: r.conditionDifference ? { ...r.conditionDifference } : null,
      conditionCurves,
      cycles: result.cycles ? { ...result.cycles } : null,
    };
  }
  let rest: RunSummary['rest'] = null;
  if (result.rest !== null) {
    series['rest:frequencyHz'] = copy(result.rest.spectrum.frequencyHz);
    series['rest:powerUv2PerHz'] = copy(result.rest.spectrum.powerPerHz);
    rest = {
      pafHz: result.rest.pafHz,
      cogHz: result.rest.cogHz,
      prominenceDb: result.rest.prominenceDb,
      noPeakReason: result.rest.noPeakReason,
      alphaWindowHz: [...result.computation.alphaSearchHz],
    };
  }
  const used = new Set(result.roiUsage.used);
  const restPeaks = new Map(result.rest?.channelPeaks.map((p) => [p.label, p]));
  const channels: ChannelStatsView[] =
    result.channels.length > 0
      ? result.channels.map((c) => ({
          label: c.label,
          canonical: c.electrode,
          inRoi: c.inRoi,
          baselineHz: c.baselineHz,
          postHz: c.postHz,
          deltaFHz: c.deltaFHz,
          ciHz: c.ciHz,
          pValue: c.pValue,
          trials: c.trialsKept,
          pafHz: null,
          cogHz: null,
          amplitudeGate: c.amplitudeGate ? { ...c.amplitudeGate } : null,
        }))
      : result.qc.channels.map((c) => ({
          label: c.label,
          canonical: null,
          inRoi: used.has(c.label),
          baselineHz: null,
          postHz: null,
          deltaFHz: null,
          ciHz: null,
          pValue: null,
          trials: null,
          pafHz: restPeaks.get(c.label)?.pafHz ?? null,
          cogHz: restPeaks.get(c.label)?.cogHz ?? null,
          amplitudeGate: null,
        }));
  const qc = result.qc;
  const quality: QualityView = {
    durationS: qc.durationS,
    sampleRatesHz: [...qc.sampleRatesHz],
    roiChannelsFound: [...qc.roiChannelsFound],
    roiChannelsMissing: [...qc.roiChannelsMissing],
    flatChannels: [...qc.flatChannels],
    saturatedChannels: [...qc.saturatedChannels],
    lineNoiseRatio50Hz: qc.lineNoiseRatio50Hz,
    lineNoiseRatio60Hz: qc.lineNoiseRatio60Hz,
    epochsDroppedShare: qc.epochsDroppedShare,
    phaseSlipShare: qc.phaseSlipShare,
    alphaPeakProminenceDb: qc.alphaPeakProminenceDb,
    channels: qc.channels.map((c) => ({ ...c })),
    warnings: [...readerWarnings, ...result.warnings],
  };
  return {
    summary: {
      bandHz: [...result.bandHz],
      bandSource: result.bandSource,
      roiUsage: {
        wanted: [...result.roiUsage.wanted],
        used: [...result.roiUsage.used],
        leftOut: result.roiUsage.leftOut.map((o) => ({ ...o })),
        status: result.roiUsage.status,
      },
      channels,
      roi,
      task,
      rest,
      quality,
      suggestsSlowing:
        result.kind === 'task' && result.roi !== null ? result.roi.suggestsSlowing : null,
    },
    series,
  };
}

function putCurve(series: ResultSeries, prefix: string, result: Pick<OnsetResult, 'curve'>): void {
  series[`${prefix}:mean`] = copy(result.curve.meanHz);
  series[`${prefix}:ciLow`] = copy(result.curve.lowerHz);
  series[`${prefix}:ciHigh`] = copy(result.curve.upperHz);
}

function evenlySpaced([start, end]: readonly [number, number], points: number): Float64Array {
  if (points <= 1) return Float64Array.of(start);
  return Float64Array.from(
    { length: points },
    (_, i) => start + ((end - start) * i) / (points - 1),
  );
}
