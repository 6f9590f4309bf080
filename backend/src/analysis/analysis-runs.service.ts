import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager } from 'typeorm';
import type {
  AnalysisRunDto,
  BandSource,
  OnsetCurveDto,
  Page,
  QualityDto,
  RecordingResultsDto,
} from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { PageQueryDto, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import { Job } from '../jobs/job.entity';
import type {
  AnalyzeOutcome,
  ResolvedAnalysisOptions,
  RunSummary,
} from '../jobs/worker/worker-tasks';
import { Recording } from '../recordings/recording.entity';
import { GYRE_VERSION } from '../version';
import { AnalysisError } from './analysis.errors';
import { AnalysisRun } from './analysis-run.entity';
import { AnalysisSettings } from './analysis-settings.entity';
import { decodeResultSeries, encodeResultSeries } from './result-series-codec';

export interface StoreRunInput {
  job: Job;
  recording: Recording;
  settings: AnalysisSettings;
  options: ResolvedAnalysisOptions;
  bandSource: BandSource;
  outcome: AnalyzeOutcome;
}

/**
 * Analysis runs and their results. Results live in SQLite: headline numbers in columns,
 * the summary as JSON and the curves as one packed Float64 blob per run. Each run names
 * its settings version, Gyre's version and the SHA-256 of the file it read.
 */
@Injectable()
export class AnalysisRunsService {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  async store(manager: EntityManager, input: StoreRunInput): Promise<AnalysisRun> {
    const { job, recording, settings, options, bandSource, outcome } = input;
    const summary = outcome.summary;
    const run = Object.assign(new AnalysisRun(), {
      id: randomUUID(),
      recordingId: recording.id,
      visitId: recording.visitId,
      participantId: recording.participantId,
      studyId: recording.studyId,
      siteId: recording.siteId,
      jobId: job.id,
      kind: recording.kind,
      settingsId: settings.id,
      settingsVersion: settings.version,
      codeVersion: GYRE_VERSION,
      inputChecksumSha256: recording.checksumSha256,
      bandLowHz: options.bandHz[0],
      bandHighHz: options.bandHz[1],
      bandSource,
      roiDeltaFHz: summary.roi?.deltaFHz ?? null,
      roiCiLowHz: summary.roi?.ciHz?.[0] ?? null,
      roiCiHighHz: summary.roi?.ciHz?.[1] ?? null,
      roiPValue: summary.roi?.pValue ?? null,
      trialsKept: summary.roi?.trialsKept ?? null,
      trialsTotal: summary.roi?.trialsTotal ?? null,
      pafHz: summary.rest?.pafHz ?? null,
      cogHz: summary.rest?.cogHz ?? null,
      suggestsSlowing: summary.suggestsSlowing,
      summaryJson: JSON.stringify(summary),
      series: encodeResultSeries(outcome.series),
      createdAt: nowIso(),
    });
    await manager.getRepository(AnalysisRun).insert(run);
    return run;
  }

  async listForRecording(
    caller: Caller,
    recordingId: string,
    query: PageQueryDto,
  ): Promise<Page<AnalysisRunDto>> {
    await this.recordingInScope(caller, recordingId, 'AnalysisRun');
    const window = pageWindowOf(query, 'desc');
    const found = await this.dataSource.getRepository(AnalysisRun).findAndCount({
      where: scopedWhere<AnalysisRun>(caller.ability, 'read', 'AnalysisRun', { recordingId }),
      select: RUN_COLUMNS,
      order: { createdAt: window.order, id: window.order },
      skip: window.skip,
      take: window.take,
    });
    return toPage(found, window, toRunDto);
  }

  /** Full results of the latest run of a recording, or of `runId`. */
  async results(caller: Caller, recordingId: string, runId?: string): Promise<RecordingResultsDto> {
    await this.recordingInScope(caller, recordingId, 'Result');
    const run = await this.dataSource.getRepository(AnalysisRun).findOne({
      where: scopedWhere<AnalysisRun>(caller.ability, 'read', 'Result', {
        recordingId,
        ...(runId === undefined ? {} : { id: runId }),
      }),
      order: { createdAt: 'DESC', id: 'DESC' },
    });
    if (run === null) {
      throw new GyreException(
        ErrorKind.NotFound,
        runId === undefined ? AnalysisError.NoResultsYet : AnalysisError.RunNotFound,
        runId === undefined
          ? `Recording ${recordingId} has no results yet.`
          : `No run ${runId} of recording ${recordingId}.`,
        { recordingId, runId: runId ?? null },
      );
    }
    return toResultsDto(run);
  }

  /** Quality checks only: what technicians see beside the processing state. */
  async quality(caller: Caller, recordingId: string): Promise<QualityDto | null> {
    await this.recordingInScope(caller, recordingId, 'Recording');
    const run = await this.dataSource.getRepository(AnalysisRun).findOne({
      where: { recordingId },
      select: { id: true, summaryJson: true },
      order: { createdAt: 'DESC', id: 'DESC' },
    });
    return run === null ? null : (JSON.parse(run.summaryJson) as RunSummary).quality;
  }

  private async recordingInScope(
    caller: Caller,
    recordingId: string,
    subjectName: 'AnalysisRun' | 'Result' | 'Recording',
  ): Promise<Recording> {
    const recording = await this.dataSource.getRepository(Recording).findOne({
      where: scopedWhere<Recording>(caller.ability, 'read', subjectName, { id: recordingId }),
    });
    if (recording === null) {
      throw new GyreException(
        ErrorKind.NotFound,
        AnalysisError.RecordingNotFound,
        `No recording ${recordingId}.`,
        {
          recordingId,
        },
      );
    }
    return recording;
  }
}

const RUN_COLUMNS = {
  id: true,
  recordingId: true,
  visitId: true,
  participantId: true,
  kind: true,
  settingsId: true,
  settingsVersion: true,
  codeVersion: true,
  inputChecksumSha256: true,
  bandLowHz: true,
  bandHighHz: true,
  bandSource: true,
  roiDeltaFHz: true,
  roiCiLowHz: true,
  roiCiHighHz: true,
  roiPValue: true,
  trialsKept: true,
  trialsTotal: true,
  pafHz: true,
  cogHz: true,
  suggestsSlowing: true,
  createdAt: true,
} as const;

export function toRunDto(run: AnalysisRun): AnalysisRunDto {
  return {
    id: run.id,
    recordingId: run.recordingId,
    visitId: run.visitId,
    participantId: run.participantId,
    kind: run.kind,
    settingsId: run.settingsId,
    settingsVersion: run.settingsVersion,
    codeVersion: run.codeVersion,
    inputChecksumSha256: run.inputChecksumSha256,
    bandHz: [run.bandLowHz, run.bandHighHz],
    bandSource: run.bandSource,
    roiDeltaFHz: run.roiDeltaFHz,
    roiCiHz:
      run.roiCiLowHz === null || run.roiCiHighHz === null
        ? null
        : [run.roiCiLowHz, run.roiCiHighHz],
    roiPValue: run.roiPValue,
    trialsKept: run.trialsKept,
    trialsTotal: run.trialsTotal,
    pafHz: run.pafHz,
    cogHz: run.cogHz,
    suggestsSlowing: run.suggestsSlowing === null ? null : Boolean(run.suggestsSlowing),
    createdAt: run.createdAt,
  };
}

/** NaN (no value) becomes null in JSON. */
function numbers(values: Float64Array | undefined): Array<number | null> {
  if (values === undefined) return [];
  return Array.from(values, (v) => (Number.isFinite(v) ? v : null));
}

function plain(values: Float64Array | undefined): number[] {
  return values === undefined ? [] : Array.from(values);
}

function curve(series: Record<string, Float64Array>, prefix: string, name: string): OnsetCurveDto {
  return {
    name,
    meanHz: numbers(series[`${prefix}:mean`]),
    ciLowHz: numbers(series[`${prefix}:ciLow`]),
    ciHighHz: numbers(series[`${prefix}:ciHigh`]),
  };
}

export function toResultsDto(run: AnalysisRun): RecordingResultsDto {
  const summary = JSON.parse(run.summaryJson) as RunSummary;
  const series = decodeResultSeries(run.series);
  let task: RecordingResultsDto['task'] = null;
  if (summary.task !== null) {
    const raster = series.raster ?? new Float64Array(0);
    const points = summary.task.rasterPoints;
    const trials: Array<Array<number | null>> = [];
    for (let t = 0; t < summary.task.rasterTrials; t++) {
      trials.push(numbers(raster.subarray(t * points, (t + 1) * points)));
    }
    task = {
      timeS: plain(series.timeS),
      baselineWindowS: summary.task.baselineWindowS,
      postWindowS: summary.task.postWindowS,
      roi: curve(series, 'roi', 'ROI'),
      channels: summary.task.curveChannels.map((label) => curve(series, `channel:${label}`, label)),
      raster: {
        timeS: plain(series['raster:timeS']),
        trials,
        trialOnsetsS: summary.task.trialOnsetsS,
      },
      trialDeltaFHz: numbers(series.trialDeltaFHz),
      epochs: summary.task.epochs,
    };
  }
  const rest: RecordingResultsDto['rest'] =
    summary.rest === null
      ? null
      : {
          frequencyHz: plain(series['rest:frequencyHz']),
          powerUv2PerHz: plain(series['rest:powerUv2PerHz']),
          pafHz: summary.rest.pafHz,
          cogHz: summary.rest.cogHz,
          prominenceDb: summary.rest.prominenceDb,
          noPeakReason: summary.rest.noPeakReason,
          alphaWindowHz: summary.rest.alphaWindowHz,
        };
  return { run: toRunDto(run), channels: summary.channels, task, rest, quality: summary.quality };
}
