import { createHash, randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager, In } from 'typeorm';
import type {
  AnalysisRunView,
  ChannelStatsView,
  Page,
  QualityView,
  RecordingResultsView,
  RoiUsageView,
  RunDepthSettings,
  RunTrigger,
} from '@gyre/shared';
import { scopedWhere, scopeSql } from '../auth/access-scope';
import { blindedResultsView, blindedRunView } from '../blinding/blinded-views';
import type { Caller } from '../auth/decorators';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import { KeptById } from '../common/kept-by-id';
import { currentRunHeads, type CurrentRunHead } from './current-run-heads.reads';
import { PageQueryDto, pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import type { AnalyzeOutcome, RunSummary } from '../jobs/worker/worker-tasks';
import { Recording } from '../recordings/recording.entity';
import { RecordingsError, recordingsError } from '../recordings/recordings.errors';
import { RecordingsService } from '../recordings/recordings.service';
import type { AnalysisSettings as SettingsValues } from '../signal/pipeline/analysis-settings';
import { GYRE_VERSION } from '../version';
import { AnalysisError, analysisError } from './analysis.errors';
import { AnalysisRun } from './analysis-run.entity';
import { AnalysisSettings } from './analysis-settings.entity';
import { encodeJson, type EncodedBody } from './encoded-body';
import { decodeResultSeries, encodeResultSeries } from './result-series-codec';
import { ResultsBodyCache } from './results-body-cache';
import {
  channelCurveOf,
  curveOf,
  roundedResults,
  taskDepthOf,
  trialRasterOf,
} from './results-http-shape';
import { BlindingService } from '../blinding/blinding.service';
import { SettingsStaleness, type StalenessInput } from './settings-staleness';
import { parseStoredSettings, settingsJson } from './settings-values';

export interface StoreRunInput {
  jobId: string;
  trigger: RunTrigger;
  recording: Recording;
  version: AnalysisSettings;
  settings: SettingsValues;
  overrideRevision: number | null;
  iafHz: number | null;
  outcome: AnalyzeOutcome;
}

/** What storing a computation did. */
export interface StoredRun {
  runId: string;
  /** False when the computation reproduced the recording's current run exactly (nothing stored). */
  stored: boolean;
  /** False when the numbers equal those of the recording's previous run. */
  numbersChanged: boolean;
  roiUsage: RoiUsageView;
  warnings: string[];
  pafHz: number | null;
  cogHz: number | null;
}

/** A current run's headline numbers (see `currentRunNumbersOfVisits`). */
export interface RunNumbers extends CurrentRunHead {
  roiUsage: RoiUsageView;
}

/** Runs whose region-of-interest usage is kept parsed: a few per visit of a few hundred visits. */
const KEPT_ROI_USAGES = 4096;

/** What the results answer shows of its recording (`source`). */
export type ResultsSource = Pick<
  Recording,
  'id' | 'kind' | 'createdAt' | 'checksumSha256' | 'replacesId' | 'replacementReason'
>;

/** A results route's recording, read with its scope check. */
type ScopedRecording = ResultsSource & Pick<Recording, 'latestRunId'>;

/** A results route's run without its curves or summary: what the notice and the key need. */
type RunHead = StalenessInput;

/** The run's columns beside its recording's in runInScope's row (null: no such run in scope). */
type RunHeadColumns =
  | {
      runId: string;
      runVisitId: string;
      runStudyId: string;
      runKind: RunHead['kind'];
      runSettingsJson: string;
    }
  | { runId: null; runVisitId: null; runStudyId: null; runKind: null; runSettingsJson: null };

/**
 * Analysis runs and their results. Results live in SQLite: headline numbers in columns, the
 * summary as JSON and the curves as one packed Float64 blob per run. Each run names its
 * effective settings, Gyre's version, the SHA-256 of the file it read and of its own numbers.
 */
@Injectable()
export class AnalysisRunsService {
  /** Region-of-interest usage by run id (see roiUsageOfRuns). */
  private readonly roiUsageKept = new KeptById<RoiUsageView>(KEPT_ROI_USAGES);

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly recordings: RecordingsService,
    private readonly bodies: ResultsBodyCache,
    private readonly reads: SqliteReadsService,
    private readonly stale: SettingsStaleness,
    private readonly blinding: BlindingService,
  ) {}

  /**
   * Inside the caller's transaction: stores a finished computation, unless it reproduced the
   * recording's current run with the same settings and input exactly (a re-run that changes
   * nothing leaves nothing behind but its audit entry).
   */
  async store(tx: EntityManager, input: StoreRunInput): Promise<StoredRun> {
    const { recording, version, outcome } = input;
    const summary = outcome.summary;
    const summaryJson = JSON.stringify(summary);
    const series = encodeResultSeries(outcome.series);
    const resultsSha256 = createHash('sha256').update(summaryJson).update(series).digest('hex');
    const effective = settingsJson(input.settings);
    const previous =
      recording.latestRunId === null
        ? null
        : await tx.getRepository(AnalysisRun).findOne({
            where: { id: recording.latestRunId },
            select: {
              id: true,
              resultsSha256: true,
              settingsJson: true,
              iafHz: true,
              inputChecksumSha256: true,
            },
          });
    const numbersChanged = previous?.resultsSha256 !== resultsSha256;
    const facts = {
      numbersChanged,
      roiUsage: summary.roiUsage,
      warnings: summary.quality.warnings,
      pafHz: summary.rest?.pafHz ?? null,
      cogHz: summary.rest?.cogHz ?? null,
    };
    if (
      previous !== null &&
      !numbersChanged &&
      previous.settingsJson === effective &&
      previous.iafHz === input.iafHz &&
      previous.inputChecksumSha256 === recording.checksumSha256
    ) {
      return { runId: previous.id, stored: false, ...facts };
    }
    const run = Object.assign(new AnalysisRun(), {
      id: randomUUID(),
      recordingId: recording.id,
      visitId: recording.visitId,
      participantId: recording.participantId,
      studyId: recording.studyId,
      siteId: recording.siteId,
      jobId: input.jobId,
      kind: recording.kind,
      trigger: input.trigger,
      settingsId: version.id,
      settingsVersion: version.version,
      settingsJson: effective,
      overrideRevision: input.overrideRevision,
      iafHz: input.iafHz,
      codeVersion: GYRE_VERSION,
      inputChecksumSha256: recording.checksumSha256,
      resultsSha256,
      bandLowHz: summary.bandHz[0],
      bandHighHz: summary.bandHz[1],
      bandSource: summary.bandSource,
      roiDeltaFHz: summary.roi?.deltaFHz ?? null,
      roiCiLowHz: summary.roi?.ciHz?.[0] ?? null,
      roiCiHighHz: summary.roi?.ciHz?.[1] ?? null,
      roiPValue: summary.roi?.pValue ?? null,
      trialsKept: summary.roi?.trialsKept ?? null,
      trialsTotal: summary.roi?.trialsTotal ?? null,
      pafHz: summary.rest?.pafHz ?? null,
      cogHz: summary.rest?.cogHz ?? null,
      suggestsSlowing: summary.suggestsSlowing,
      summaryJson,
      series,
      createdAt: nowIso(),
    });
    await tx.getRepository(AnalysisRun).insert(run);
    return { runId: run.id, stored: true, ...facts };
  }

  /** The visit's resting IAF now: PAF (else CoG) of its current resting recording's numbers. */
  async currentIafOfVisit(visitId: string): Promise<number | null> {
    const current = await this.recordings.currentOfVisits([visitId]);
    const rest = current.find((r) => r.kind === 'resting' && r.state === 'ready');
    return rest === undefined ? null : this.iafOfRun(rest.latestRunId);
  }

  /** The resting IAF a run found: PAF, else CoG (no clear peak), else null. */
  async iafOfRun(runId: string | null): Promise<number | null> {
    if (runId === null) return null;
    const run = await this.dataSource.getRepository(AnalysisRun).findOne({
      where: { id: runId },
      select: { id: true, pafHz: true, cogHz: true },
    });
    return run?.pafHz ?? run?.cogHz ?? null;
  }

  /** The resting IAF each run's band followed (null = none was known), by run id. */
  async iafUsedByRuns(runIds: readonly string[]): Promise<Map<string, number | null>> {
    if (runIds.length === 0) return new Map();
    const rows = await this.dataSource.getRepository(AnalysisRun).find({
      where: { id: In([...runIds]) },
      select: { id: true, iafHz: true },
    });
    return new Map(rows.map((r) => [r.id, r.iafHz]));
  }

  /** The runs behind the current numbers of each visit: one per kind at most. */
  async currentRunsOfVisits(visitIds: readonly string[]): Promise<AnalysisRun[]> {
    const current = await this.recordings.currentOfVisits(visitIds);
    const runIds = current.flatMap((r) => (r.latestRunId === null ? [] : [r.latestRunId]));
    if (runIds.length === 0) return [];
    return this.dataSource.getRepository(AnalysisRun).find({ where: { id: In(runIds) } });
  }

  /**
   * The headline numbers of each visit's current runs, without curves or summary (what
   * trajectories read): one prepared statement, the current recordings joined to their latest
   * runs, in upload order. Reading whole rows here once pulled every run's packed curves
   * (about 0.6 MB for a 64-channel task) into each trajectory request.
   */
  currentRunNumbersOfVisits(visitIds: readonly string[]): Promise<RunNumbers[]> {
    const rows = currentRunHeads(this.reads, { visitIds });
    const usage = this.roiUsageOfRuns(rows.map((row) => row.id));
    return Promise.resolve(
      rows.map((row) => ({ ...row, roiUsage: usage.get(row.id) as RoiUsageView })),
    );
  }

  /**
   * Which region-of-interest channels each run used, from its summary. Parsing a 64-channel
   * summary (json_extract reads the whole text) was most of a trajectory request's CPU, so
   * each run's answer is kept: a stored run never changes (runs are only ever inserted), so
   * the kept value is that of the row for good. Kept values are frozen: shared, never changed.
   */
  private roiUsageOfRuns(runIds: readonly string[]): Map<string, RoiUsageView> {
    return this.roiUsageKept.get(runIds, (missing) =>
      this.reads
        .all<{ id: string; roiUsage: string }>(
          `SELECT "id", json_extract("summaryJson", '$.roiUsage') AS "roiUsage"
            FROM "analysis_run" WHERE "id" IN (SELECT value FROM json_each(?))`,
          [JSON.stringify(missing)],
        )
        .map((row) => [row.id, deepFreeze(JSON.parse(row.roiUsage) as RoiUsageView)]),
    );
  }

  async listForRecording(
    caller: Caller,
    recordingId: string,
    query: PageQueryDto,
  ): Promise<Page<AnalysisRunView>> {
    const recording = await this.recordings.findInScope(caller, recordingId, 'read', 'AnalysisRun');
    const window = pageWindowOf(query, 'desc');
    const found = await this.dataSource.getRepository(AnalysisRun).findAndCount({
      where: scopedWhere<AnalysisRun>(caller.ability, 'read', 'AnalysisRun', { recordingId }),
      select: RUN_COLUMNS,
      ...pageSliceOf(window, 'createdAt', window.order),
    });
    const stale = await this.staleness(found[0]);
    const clock = await this.blinding.clockOf(caller, recording.visitId);
    return toPage(found, window, (run) => {
      const view = toRunView(run, stale.get(run.id) ?? []);
      return clock === null ? view : blindedRunView(view, clock);
    });
  }

  /**
   * `GET …/results`: the results of the recording's current run, or of `runId`, shaped for
   * the screens (results-http-shape.ts), serialised and compressed once per run and notice.
   * Per request: the caller's access to the recording and the run, and the stale-settings
   * notice (the study's settings may change after the run); both happen before the cache.
   * The notice is part of the key; so is what the answer shows of the recording, whose
   * replacement reason may be written after the run.
   */
  async resultsBody(caller: Caller, recordingId: string, runId?: string): Promise<EncodedBody> {
    const { recording, run } = this.runInScope(caller, recordingId, runId);
    const stale = (await this.staleness([run])).get(run.id) ?? [];
    // Blinded review: the analyst's answer shows the visit's times by its blinded clock.
    const clock = await this.blinding.clockOf(caller, run.visitId);
    const key = `${run.id} results ${JSON.stringify([stale, sourceOf(recording), clock === null ? '' : clock(recording.createdAt)])}`;
    return this.bodies.get(key, async () => {
      const full = await this.storedRun(run.id);
      const view = toResultsView(full, recording, stale);
      return encodeJson(roundedResults(clock === null ? view : blindedResultsView(view, clock)));
    });
  }

  /** `GET …/results/raster`: the region of interest's trial raster and per-trial Δf. */
  async rasterBody(caller: Caller, recordingId: string, runId?: string): Promise<EncodedBody> {
    const { run } = this.runInScope(caller, recordingId, runId);
    return this.bodies.get(`${run.id} raster`, async () => {
      const full = await this.storedRun(run.id);
      const raster = trialRasterOf(summaryOf(full), decodeResultSeries(full.series));
      if (raster === null) {
        throw analysisError(
          AnalysisError.NoTaskResults,
          `Run ${run.id} of recording ${recordingId} has no trial raster (a resting recording, or no region-of-interest channel).`,
          { recordingId, runId: run.id },
        );
      }
      return encodeJson(raster);
    });
  }

  /** `GET …/results/curves?channel=`: one channel's onset curve. */
  async channelCurveBody(
    caller: Caller,
    recordingId: string,
    channel: string,
    runId?: string,
  ): Promise<EncodedBody> {
    const { run } = this.runInScope(caller, recordingId, runId);
    return this.bodies.get(`${run.id} curve ${channel}`, async () => {
      const full = await this.storedRun(run.id);
      const summary = summaryOf(full);
      const curve = channelCurveOf(summary, decodeResultSeries(full.series), channel);
      if (curve === null) {
        throw analysisError(
          AnalysisError.ChannelCurveNotFound,
          `channel: run ${run.id} has no onset curve for "${channel}"; it has ${
            summary.task === null || summary.task.curveChannels.length === 0
              ? 'none'
              : summary.task.curveChannels.map((c) => `"${c}"`).join(', ')
          }.`,
          { field: 'channel', channel, runId: run.id },
        );
      }
      return encodeJson(curve);
    });
  }

  /**
   * The recording and the run a results route names, both checked against the caller's
   * scope on every request (404 otherwise), as `RecordingsService.findInScope` and
   * `scopedWhere` check them, in one prepared statement (the hot path of every results
   * route). The run is read without its curves or summary.
   */
  private runInScope(
    caller: Caller,
    recordingId: string,
    runId: string | undefined,
  ): { recording: ScopedRecording; run: RunHead } {
    const recordingScope = scopeSql(caller.ability, 'read', 'Result', 'recording');
    const runScope = scopeSql(caller.ability, 'read', 'Result', 'run');
    const row = this.reads.one<ScopedRecording & RunHeadColumns>(
      `SELECT recording."id" AS "id", recording."kind" AS "kind",
          recording."createdAt" AS "createdAt", recording."checksumSha256" AS "checksumSha256",
          recording."replacesId" AS "replacesId",
          recording."replacementReason" AS "replacementReason",
          recording."latestRunId" AS "latestRunId",
          run."id" AS "runId", run."visitId" AS "runVisitId", run."studyId" AS "runStudyId",
          run."kind" AS "runKind", run."settingsJson" AS "runSettingsJson"
        FROM "recording" recording
        LEFT JOIN "analysis_run" run
          ON run."recordingId" = recording."id"
          AND run."id" = coalesce(?, recording."latestRunId")
          AND ${runScope.sql}
        WHERE recording."id" = ? AND ${recordingScope.sql}`,
      [runId ?? null, ...runScope.params, recordingId, ...recordingScope.params],
    );
    if (row === null) {
      throw recordingsError(RecordingsError.NotFound, `No recording ${recordingId}.`, {
        recordingId,
      });
    }
    if (row.runId === null) {
      throw analysisError(
        runId === undefined ? AnalysisError.NoResultsYet : AnalysisError.RunNotFound,
        runId === undefined
          ? `Recording ${recordingId} has no results yet.`
          : `No run ${runId} of recording ${recordingId}.`,
        { recordingId, runId: runId ?? null },
      );
    }
    const recording: ScopedRecording = {
      id: row.id,
      kind: row.kind,
      createdAt: row.createdAt,
      checksumSha256: row.checksumSha256,
      replacesId: row.replacesId,
      replacementReason: row.replacementReason,
      latestRunId: row.latestRunId,
    };
    const run: RunHead = {
      id: row.runId,
      visitId: row.runVisitId,
      studyId: row.runStudyId,
      kind: row.runKind,
      settingsJson: row.runSettingsJson,
    };
    return { recording, run };
  }

  /** A run with everything stored (curves included), for building a body once. */
  private storedRun(runId: string): Promise<AnalysisRun> {
    return this.dataSource.getRepository(AnalysisRun).findOneByOrFail({ id: runId });
  }

  /** Quality checks only: what technicians see beside the processing state. */
  async quality(caller: Caller, recordingId: string): Promise<QualityView | null> {
    const recording = await this.recordings.findInScope(caller, recordingId, 'read', 'Recording');
    if (recording.latestRunId === null) return null;
    const run = await this.dataSource.getRepository(AnalysisRun).findOne({
      where: { id: recording.latestRunId },
      select: { id: true, summaryJson: true },
    });
    return run === null ? null : (JSON.parse(run.summaryJson) as RunSummary).quality;
  }

  /**
   * For each run: what the visit's current settings would compute differently, in words
   * (read live on every call; see settings-staleness.ts).
   */
  staleness(runs: readonly StalenessInput[]): Promise<Map<string, string[]>> {
    return this.stale.forRuns(runs);
  }
}

const RUN_COLUMNS = {
  id: true,
  recordingId: true,
  visitId: true,
  participantId: true,
  studyId: true,
  siteId: true,
  kind: true,
  trigger: true,
  settingsId: true,
  settingsVersion: true,
  settingsJson: true,
  overrideRevision: true,
  iafHz: true,
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
  summaryJson: true,
  createdAt: true,
} as const;

export function roiUsageOf(run: Pick<AnalysisRun, 'summaryJson'>): RoiUsageView {
  return (JSON.parse(run.summaryJson) as RunSummary).roiUsage;
}

/** The run's confidence interval of the ROI's ΔF, or null when it has none. */
export function roiCiOf(
  run: Pick<AnalysisRun, 'roiCiLowHz' | 'roiCiHighHz'>,
): [number, number] | null {
  return run.roiCiLowHz === null || run.roiCiHighHz === null
    ? null
    : [run.roiCiLowHz, run.roiCiHighHz];
}

export function toRunView(run: AnalysisRun, staleSettings: string[]): AnalysisRunView {
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
    roiCiHz: roiCiOf(run),
    roiPValue: run.roiPValue,
    trialsKept: run.trialsKept,
    trialsTotal: run.trialsTotal,
    pafHz: run.pafHz,
    cogHz: run.cogHz,
    suggestsSlowing: run.suggestsSlowing === null ? null : Boolean(run.suggestsSlowing),
    trigger: run.trigger,
    roiUsage: roiUsageOf(run),
    overrideRevision: run.overrideRevision,
    depthSettings: depthSettingsOf(run),
    staleSettings,
    createdAt: run.createdAt,
  };
}

/** The analysis-depth settings of a run's stored settings. */
function depthSettingsOf(run: Pick<AnalysisRun, 'settingsJson'>): RunDepthSettings {
  const settings = parseStoredSettings(run.settingsJson);
  return {
    amplitudeGatePercentile: settings.amplitudeGatePercentile,
    cycleDisagreementHz: settings.cycleDisagreementHz,
    compareConditions: settings.compareConditions,
  };
}

function deepFreeze<T>(value: T): T {
  if (typeof value === 'object' && value !== null) {
    for (const inner of Object.values(value)) deepFreeze(inner);
    Object.freeze(value);
  }
  return value;
}

function sourceOf(recording: ResultsSource): RecordingResultsView['source'] {
  return {
    recordingId: recording.id,
    kind: recording.kind,
    uploadedAt: recording.createdAt,
    checksumSha256: recording.checksumSha256,
    replacesId: recording.replacesId,
    replacementReason: recording.replacementReason,
  };
}

function plain(values: Float64Array | undefined): number[] {
  return values === undefined ? [] : Array.from(values);
}

/** A stored channel row; rows stored before PAF/CoG and the amplitude gate lack those keys. */
function channelOf(channel: ChannelStatsView): ChannelStatsView {
  return {
    ...channel,
    pafHz: channel.pafHz ?? null,
    cogHz: channel.cogHz ?? null,
    amplitudeGate: channel.amplitudeGate ?? null,
  };
}

function summaryOf(run: Pick<AnalysisRun, 'summaryJson'>): RunSummary {
  return JSON.parse(run.summaryJson) as RunSummary;
}

/**
 * A run's results at full precision, as stored: what the visit report reads. The results
 * route sends these with rounded series (results-http-shape.ts); the trial raster and the
 * channels' curves have routes of their own.
 */
export function toResultsView(
  run: AnalysisRun,
  recording: ResultsSource,
  staleSettings: string[],
): RecordingResultsView {
  const summary = summaryOf(run);
  const series = decodeResultSeries(run.series);
  let task: RecordingResultsView['task'] = null;
  if (summary.task !== null) {
    task = {
      timeS: plain(series.timeS),
      baselineWindowS: summary.task.baselineWindowS,
      postWindowS: summary.task.postWindowS,
      roi: curveOf(series, 'roi', 'ROI'),
      curveChannels: summary.task.curveChannels,
      raster: { trials: summary.task.rasterTrials, points: summary.task.rasterPoints },
      epochs: summary.task.epochs,
      ...taskDepthOf(summary.task, series),
    };
  }
  const rest: RecordingResultsView['rest'] =
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
  return {
    run: toRunView(run, staleSettings),
    source: sourceOf(recording),
    channels: summary.channels.map(channelOf),
    task,
    rest,
    quality: summary.quality,
  };
}
