import { Inject, Injectable, Logger } from '@nestjs/common';
import { EventEmitter2 } from '@nestjs/event-emitter';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { AnalysisEvents } from '../analysis/analysis.events';
import type { VisitResultsChanged } from '../analysis/analysis.events';
import { AnalysisRun } from '../analysis/analysis-run.entity';
import { AnalysisRunsService } from '../analysis/analysis-runs.service';
import { AnalysisSettings } from '../analysis/analysis-settings.entity';
import { valuesOf } from '../analysis/analysis-settings.service';
import { VisitAnalysisOverridesService } from '../analysis/visit-analysis-overrides.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import type { AnalyzeOutcome } from '../jobs/worker/worker-tasks';
import { JOB_QUEUE } from '../queue/job-queue';
import type { JobQueue, QueuedJob } from '../queue/job-queue';
import { Recording } from '../recordings/recording.entity';
import type { ComputationInput, ComputationPayload } from '../recordings/recordings.events';
import { RecordingsService } from '../recordings/recordings.service';
import type { AttemptRef, RemoteJobData } from '../remote-workers/remote-job';
import type { AnalysisSettings as SettingsValues } from '../signal/pipeline/analysis-settings';
import { GYRE_VERSION } from '../version';
import { withExclusions } from './roi-exclusions';

/** What a computation is computed with; its run records all of it. */
export interface ComputationContext {
  version: AnalysisSettings;
  settings: SettingsValues;
  overrideRevision: number | null;
  iafHz: number | null;
}

/** A claimed job whose recording is now `computing`, with everything the computation needs. */
export interface PreparedComputation {
  job: QueuedJob<ComputationPayload>;
  input: ComputationInput;
  context: ComputationContext;
}

/** What storing a result did. */
export type FinishOutcome =
  /** The run is stored (or the numbers were reproduced exactly: `newRun` false). */
  | { kind: 'stored'; runId: string; newRun: boolean }
  /** This attempt's result was stored before: nothing written. */
  | { kind: 'duplicate'; runId: string | null }
  /** The attempt is no longer the job's current one (or the job is unknown): nothing written. */
  | { kind: 'stale' };

/**
 * The steps every computation goes through, whoever computes it (this process's worker threads
 * or a remote worker): prepare (the recording becomes `computing`; the visit's effective
 * settings and resting IAF are resolved), then finish (run stored, recording `ready`, job done,
 * all in one transaction; then "visit results changed") or fail the attempt. Finishing and
 * failing act only while the attempt is the job's current one, checked inside the same
 * transaction, so a late or repeated answer changes nothing.
 */
@Injectable()
export class ComputationStepsService {
  private readonly logger = new Logger('Computations');

  constructor(
    @Inject(JOB_QUEUE) private readonly queue: JobQueue,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly recordings: RecordingsService,
    private readonly overrides: VisitAnalysisOverridesService,
    private readonly runs: AnalysisRunsService,
    private readonly writes: WriteTransactionsService,
    private readonly events: EventEmitter2,
  ) {}

  /** The recording becomes `computing`; null (and the job done) when it was replaced meanwhile. */
  async prepare(job: QueuedJob<ComputationPayload>): Promise<PreparedComputation | null> {
    const input = await this.recordings.startComputing(job);
    if (input === null) {
      await this.writes.run((tx) => this.queue.complete(tx, job.id));
      return null;
    }
    return { job, input, context: await this.contextFor(input.recording) };
  }

  /** The visit's effective settings (study version with the visit's override) and resting IAF. */
  async contextFor(recording: Recording): Promise<ComputationContext> {
    const effective = await this.overrides.effectiveFor(recording.studyId, recording.visitId);
    const iafHz =
      recording.kind === 'task' ? await this.runs.currentIafOfVisit(recording.visitId) : null;
    return {
      version: effective.version,
      settings: effective.settings,
      overrideRevision: effective.overrideRevision,
      iafHz,
    };
  }

  /** The context a remote job was dispatched with (its settings version, read again). */
  async contextOfRemote(data: RemoteJobData): Promise<ComputationContext> {
    const version = await this.dataSource
      .getRepository(AnalysisSettings)
      .findOneByOrFail({ id: data.settingsVersionId });
    return {
      version,
      settings: data.settings,
      overrideRevision: data.overrideRevision,
      iafHz: data.iafHz,
    };
  }

  /** What a remote worker gets: the task and what storing its result needs. */
  remoteJobData(prepared: PreparedComputation): RemoteJobData {
    const { job, input, context } = prepared;
    return {
      jobId: job.id,
      attempt: job.attempts,
      recordingId: input.recording.id,
      checksumSha256: input.recording.checksumSha256,
      fileBytes: input.recording.sizeBytes,
      kind: input.recording.kind,
      csvOnsets: input.csvOnsets,
      settings: context.settings,
      iafHz: context.iafHz,
      gyreVersion: GYRE_VERSION,
      settingsVersionId: context.version.id,
      overrideRevision: context.overrideRevision,
    };
  }

  /**
   * Stores a finished computation of attempt `ref`: the run, the recording `ready`, the job
   * done, in one transaction that first checks the attempt is still the job's current one.
   * Without a context (Redis lost the attempt's data) only a repeated result can be answered.
   */
  async finish(
    ref: AttemptRef,
    context: ComputationContext | null,
    outcome: AnalyzeOutcome,
  ): Promise<FinishOutcome> {
    const done = await this.writes.run(async (tx) => {
      const job = await this.queue.byId<ComputationPayload>(ref.jobId, tx);
      if (job === null || job.attempts !== ref.attempt) return { kind: 'stale' as const };
      const recording = await tx
        .getRepository(Recording)
        .findOneByOrFail({ id: job.payload.recordingId });
      if (job.state === 'done') {
        // The run this attempt stored; none when it reproduced the numbers (then the current).
        const run = await tx.getRepository(AnalysisRun).findOne({
          where: { jobId: job.id },
          select: { id: true },
          order: { createdAt: 'DESC' },
        });
        return { kind: 'duplicate' as const, runId: run?.id ?? recording.latestRunId };
      }
      if (job.state !== 'running' || context === null) return { kind: 'stale' as const };
      const exclusions = withExclusions(
        outcome.summary.roiUsage,
        valuesOf(context.version).roi,
        context.settings.roi,
      );
      outcome.summary.roiUsage = exclusions.usage;
      outcome.summary.quality.warnings.push(...exclusions.warnings);
      const stored = await this.runs.store(tx, {
        jobId: job.id,
        trigger: job.payload.trigger,
        recording,
        version: context.version,
        settings: context.settings,
        overrideRevision: context.overrideRevision,
        iafHz: context.iafHz,
        outcome,
      });
      const ready = await this.recordings.finishComputing(tx, recording.id, stored);
      await this.queue.complete(tx, job.id);
      return { kind: 'stored' as const, recording, stored, ready };
    });
    if (done.kind !== 'stored') return done;
    const { recording, stored, ready } = done;
    await this.recordings.announce([recording.id]);
    if (ready !== null) {
      const event: VisitResultsChanged = {
        visitId: recording.visitId,
        studyId: recording.studyId,
        siteId: recording.siteId,
        participantId: recording.participantId,
        recordingId: recording.id,
        kind: recording.kind,
        runId: stored.runId,
        numbersChanged: stored.numbersChanged,
        iafHz: recording.kind === 'resting' ? (stored.pafHz ?? stored.cogHz) : null,
      };
      await this.events.emitAsync(AnalysisEvents.VisitResultsChanged, event);
    }
    return { kind: 'stored', runId: stored.runId, newRun: stored.stored };
  }

  /**
   * Attempt `ref` failed: the job is queued again (or failed after its last attempt) and the
   * recording follows it. False when the attempt is no longer current (nothing written).
   */
  async failAttempt(ref: AttemptRef, message: string): Promise<boolean> {
    const failed = await this.writes.run(async (tx) => {
      const job = await this.queue.byId<ComputationPayload>(ref.jobId, tx);
      if (job === null || job.state !== 'running' || job.attempts !== ref.attempt) return null;
      const error = `Attempt ${job.attempts} of ${job.maxAttempts} failed: ${message}`;
      const outcome = await this.queue.fail(tx, job.id, error);
      await this.recordings.failComputing(tx, job.payload.recordingId, outcome, error);
      return { recordingId: job.payload.recordingId, error };
    });
    if (failed === null) return false;
    this.logger.warn(`Job ${ref.jobId} (recording ${failed.recordingId}): ${failed.error}`);
    await this.recordings.announce([failed.recordingId]);
    return true;
  }
}
