import { createHash } from 'node:crypto';
import type { ChannelStatsDto, QualityDto } from '@gyre/shared';
import { normaliseChannelLabel } from '../../signal/channels';
import type { EdfSignalHeader } from '../../signal/edf';
import { analyzeRecording } from '../../signal/pipeline/analyze-recording';
import type { AnalysisResult, OnsetResult } from '../../signal/pipeline/analysis.types';
import { readEdfFile } from '../../signal/pipeline/read-edf-file';
import type { AnalyzeOutcome, AnalyzeTask, ResultSeries, RunSummary } from './worker-tasks';

/**
 * One computation in a worker thread: read the stored file, check it is the file the
 * run names (SHA-256), run the signal core with the resolved settings and turn its
 * result into Gyre's stored shape. Every series is a fresh Float64Array, so each has
 * its own buffer to transfer.
 */
export async function runAnalysis(
  task: Omit<AnalyzeTask, 'progressPort'>,
  onProgress: (percent: number) => void,
): Promise<AnalyzeOutcome> {
  // Streamed from disk: the file is hashed and decoded chunk by chunk, and only the
  // channels the analysis uses are decoded (never the whole file in memory).
  const hash = createHash('sha256');
  const read = await readEdfFile(task.filePath, {
    selectSignal: analysedSignals,
    onChunk: (chunk) => hash.update(chunk),
  });
  const actual = hash.digest('hex');
  if (actual !== task.checksumSha256) {
    throw new Error(
      `stored file: SHA-256 ${actual} found, ${task.checksumSha256} expected (the file changed on disk)`,
    );
  }
  onProgress(2);
  const recording = read.finish();
  onProgress(5);
  const { options } = task;
  const result = analyzeRecording(recording, {
    kind: task.kind === 'task' ? 'task' : 'rest',
    bandHz: options.bandHz,
    iafHz: (options.bandHz[0] + options.bandHz[1]) / 2,
    method: options.method === 'morlet' ? 'morlet' : 'plateau',
    morletCycles: options.morletCycles,
    onsets: task.csvOnsets ?? undefined,
    onsetLabel: options.onsetLabel,
    epochS: options.epochWindowS,
    baselineS: options.baselineWindowS,
    postS: options.postWindowS,
    amplitudeLimitUv: options.rejectionThresholdUv,
    bootstrapResamples: options.bootstrapResamples,
    bootstrapSeed: options.bootstrapSeed,
    slowingThresholdHz: options.flagThresholdHz,
    roiLabels: options.roi,
    onProgress: (fraction) => onProgress(5 + 94 * fraction),
  });
  return toOutcome(result, recording.warnings);
}

/**
 * The signals `analyzeRecording` analyses: the 10-10 electrodes, or every signal when no
 * label is one (decided from the header alone, before any sample is decoded).
 */
function analysedSignals(
  signal: EdfSignalHeader,
  _fileIndex: number,
  all: readonly EdfSignalHeader[],
): boolean {
  return (
    normaliseChannelLabel(signal.label) !== null ||
    all.every((s) => normaliseChannelLabel(s.label) === null)
  );
}

const copy = (values: ArrayLike<number>): Float64Array => Float64Array.from(values);

export function toOutcome(
  result: AnalysisResult,
  readerWarnings: readonly string[],
): AnalyzeOutcome {
  const series: ResultSeries = {};
  let task: RunSummary['task'] = null;
  let roi: RunSummary['roi'] = null;
  const curveChannels: string[] = [];
  if (result.kind === 'task' && result.roi !== null) {
    const r = result.roi;
    series.timeS = copy(r.curve.timesS);
    putCurve(series, 'roi', r);
    for (const channel of result.channels) {
      if (channel.curve.meanHz.length === 0) continue;
      putCurve(series, `channel:${channel.label}`, channel);
      curveChannels.push(channel.label);
    }
    series['raster:timeS'] =
      r.rasterPoints === r.curve.timesS.length
        ? copy(r.curve.timesS)
        : evenlySpaced(result.settings.epochS, r.rasterPoints);
    series.raster = copy(r.raster);
    series.trialDeltaFHz = Float64Array.from(
      r.trialPostHz,
      (post, i) => post - r.trialBaselineHz[i],
    );
    roi = {
      baselineHz: r.baselineHz,
      postHz: r.postHz,
      deltaFHz: r.deltaHz,
      ciHz: r.ci95Hz,
      pValue: r.p,
      trialsKept: r.trialsKept,
      trialsTotal: r.trialsKept + r.trialsDropped,
    };
    task = {
      baselineWindowS: result.settings.baselineS,
      postWindowS: result.settings.postS,
      epochs: {
        total: r.trialsKept + r.trialsDropped,
        kept: r.trialsKept,
        dropped: { ...r.dropReasons },
      },
      trialOnsetsS: [],
      curveChannels,
      rasterTrials: r.rasterTrials,
      rasterPoints: r.rasterPoints,
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
      alphaWindowHz: result.settings.alphaSearchHz,
    };
  }
  const channels: ChannelStatsDto[] =
    result.channels.length > 0
      ? result.channels.map((c) => ({
          label: c.label,
          canonical: c.electrode,
          inRoi: c.inRoi,
          baselineHz: c.baselineHz,
          postHz: c.postHz,
          deltaFHz: c.deltaHz,
          ciHz: c.ci95Hz,
          pValue: c.p,
          trials: c.trialsKept,
        }))
      : result.qc.channels.map((c) => ({
          label: c.label,
          canonical: null,
          inRoi: result.qc.roiChannelsFound.includes(c.label),
          baselineHz: null,
          postHz: null,
          deltaFHz: null,
          ciHz: null,
          pValue: null,
          trials: null,
        }));
  const qc = result.qc;
  const quality: QualityDto = {
    durationS: qc.durationS,
    sampleRatesHz: qc.sampleRatesHz,
    roiChannelsFound: qc.roiChannelsFound,
    roiChannelsMissing: qc.roiChannelsMissing,
    flatChannels: qc.flatChannels,
    saturatedChannels: qc.saturatedChannels,
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
      channels,
      roi,
      task,
      rest,
      quality,
      suggestsSlowing:
        result.kind === 'task' && result.roi !== null ? result.roi.suggestedFlag : null,
    },
    series,
  };
}

function putCurve(series: ResultSeries, prefix: string, result: OnsetResult): void {
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
