import { createReadStream } from 'node:fs';
import type { ReadStream } from 'node:fs';
import { Inject, Injectable, Logger } from '@nestjs/common';
import type { WorkerPrincipal } from '../auth/auth-user';
import { GyreException } from '../common/errors/gyre.exception';
import { ComputationStepsService } from '../processing/computation-steps.service';
import { ComputationsService } from '../processing/computations.service';
import { RemoteComputationsService } from '../processing/remote-computations.service';
import { JOB_QUEUE } from '../queue/job-queue';
import type { JobQueue, QueuedJob } from '../queue/job-queue';
import type { ComputationPayload } from '../recordings/recordings.events';
import { RecordingsService } from '../recordings/recordings.service';
import { GYRE_VERSION } from '../version';
import type { WorkerResultView } from './dto/worker-answers';
import type { AttemptRef, RemoteTask } from './remote-job';
import { RemoteWorkersError, remoteWorkersError } from './remote-workers.errors';
import { parseResultBody } from './result-wire';

/** Progress reaches the queue table at most this often per job (SSE listeners get each post). */
const PROGRESS_WRITE_INTERVAL_MS = 1000;

/**
 * The worker API's work: a worker may read the input and the stored file of an attempt that
 * is the job's current one, report its progress, and post its result or its failure. Results
 * and failures go through the same steps as computations made in this process
 * (processing/computation-steps.service.ts), so the state machine, audit entries and events
 * are the same; a repeated result is answered from what is stored, a late one is refused.
 */
@Injectable()
export class WorkerJobsService {
  private readonly logger = new Logger('WorkerApi');
  private readonly progressWrittenAt = new Map<string, number>();

  constructor(
    @Inject(JOB_QUEUE) private readonly queue: JobQueue,
    private readonly recordings: RecordingsService,
    private readonly steps: ComputationStepsService,
    private readonly computations: ComputationsService,
    private readonly remote: RemoteComputationsService,
  ) {}

  /** What the worker computes (the data the attempt was dispatched with). */
  async task(ref: AttemptRef): Promise<RemoteTask> {
    await this.current(ref);
    const data = await this.remote.data(ref);
    if (data === null) throw handedOverAgain(ref);
    const { settingsVersionId: _version, overrideRevision: _revision, ...task } = data;
    return task;
  }

  /** The stored recording of a current attempt, to stream to the worker. */
  async file(ref: AttemptRef): Promise<{ stream: ReadStream; sizeBytes: number; sha256: string }> {
    const job = await this.current(ref);
    const input = await this.recordings.computingInput(job.payload.recordingId);
    if (input === null) throw notCurrent(ref, 'its recording is not computing');
    return {
      stream: createReadStream(input.filePath),
      sizeBytes: input.recording.sizeBytes,
      sha256: input.recording.checksumSha256,
    };
  }

  async progress(ref: AttemptRef, percent: number): Promise<void> {
    const job = await this.current(ref);
    const whole = Math.max(0, Math.min(99, Math.floor(percent)));
    this.recordings.emitProgress(job.payload.recordingId, whole);
    const now = Date.now();
    if (now - (this.progressWrittenAt.get(job.id) ?? 0) < PROGRESS_WRITE_INTERVAL_MS) return;
    if (this.progressWrittenAt.size > 1000) this.progressWrittenAt.clear();
    this.progressWrittenAt.set(job.id, now);
    await this.queue.progress(job.id, whole);
  }

  /**
   * Stores a posted result: 400 naming what is wrong with it, 422 from a worker of another
   * Gyre version, 409 when the attempt is not current; the same attempt's result again is
   * answered with what was stored and writes nothing.
   */
  async result(ref: AttemptRef, body: unknown, worker: WorkerPrincipal): Promise<WorkerResultView> {
    this.assertRemote();
    const parsed = parseResultBody(body);
    if (!parsed.ok) {
      throw remoteWorkersError(
        RemoteWorkersError.ResultInvalid,
        `The result is not one Gyre can store: ${parsed.problems.join('; ')}`,
        { problems: parsed.problems },
      );
    }
    if (parsed.gyreVersion !== GYRE_VERSION) throw versionMismatch(parsed.gyreVersion);
    const data = await this.remote.data(ref);
    const context = data === null ? null : await this.steps.contextOfRemote(data);
    const outcome = await this.steps.finish(ref, context, parsed.outcome);
    if (outcome.kind === 'stale') throw await this.refusal(ref);
    this.progressWrittenAt.delete(ref.jobId);
    this.computations.pump();
    if (outcome.kind === 'duplicate') {
      this.logger.log(`Job ${ref.jobId} attempt ${ref.attempt}: result again from ${worker.name}`);
      return { runId: outcome.runId, newRun: false, duplicate: true };
    }
    this.logger.log(`Job ${ref.jobId} attempt ${ref.attempt}: result from ${worker.name}`);
    return { runId: outcome.runId, newRun: outcome.newRun, duplicate: false };
  }

  /** The computation failed on the worker: the attempt counts, as a failure here would. */
  async failure(ref: AttemptRef, message: string, worker: WorkerPrincipal): Promise<void> {
    this.assertRemote();
    const recorded = await this.steps.failAttempt(ref, `${message} (worker ${worker.name})`);
    if (!recorded) throw await this.refusal(ref);
    this.progressWrittenAt.delete(ref.jobId);
    this.computations.pump();
  }

  /** The job, when `ref` is its running attempt; else 404 (no such job) or 409. */
  private async current(ref: AttemptRef): Promise<QueuedJob<ComputationPayload>> {
    this.assertRemote();
    const job = await this.queue.byId<ComputationPayload>(ref.jobId);
    if (job === null) throw jobNotFound(ref);
    if (job.state !== 'running' || job.attempts !== ref.attempt) {
      throw notCurrent(ref, `the job is ${job.state} at attempt ${job.attempts}`);
    }
    return job;
  }

  private async refusal(ref: AttemptRef): Promise<GyreException> {
    const job = await this.queue.byId(ref.jobId);
    if (job === null) return jobNotFound(ref);
    if (job.state === 'running' && job.attempts === ref.attempt) return handedOverAgain(ref);
    return notCurrent(ref, `the job is ${job.state} at attempt ${job.attempts}`);
  }

  private assertRemote(): void {
    if (!this.remote.enabled) {
      throw remoteWorkersError(
        RemoteWorkersError.NotRemote,
        'This server computes in its own process (REDIS_URL is not set): it has no jobs for workers.',
      );
    }
  }
}

function jobNotFound(ref: AttemptRef): GyreException {
  return remoteWorkersError(RemoteWorkersError.JobNotFound, `No job ${ref.jobId}.`, {
    ...ref,
  });
}

function notCurrent(ref: AttemptRef, why: string): GyreException {
  return remoteWorkersError(
    RemoteWorkersError.AttemptNotCurrent,
    `Attempt ${ref.attempt} of job ${ref.jobId} is not current: ${why}.`,
    { ...ref },
  );
}

function handedOverAgain(ref: AttemptRef): GyreException {
  return notCurrent(ref, 'Redis no longer holds it; the server hands it over again');
}

function versionMismatch(workerVersion: string): GyreException {
  return remoteWorkersError(
    RemoteWorkersError.VersionMismatch,
    `The worker runs Gyre ${workerVersion} and the server ${GYRE_VERSION}: results are only taken from the same version.`,
    { workerVersion, serverVersion: GYRE_VERSION },
  );
}
