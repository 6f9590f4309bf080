import {
  Inject,
  Injectable,
  Logger,
  OnApplicationBootstrap,
  OnModuleDestroy,
} from '@nestjs/common';
import { EventEmitter2, OnEvent } from '@nestjs/event-emitter';
import { AnalysisEvents } from '../analysis/analysis.events';
import type { VisitResultsChanged } from '../analysis/analysis.events';
import { AnalysisRunsService } from '../analysis/analysis-runs.service';
import { valuesOf } from '../analysis/analysis-settings.service';
import { VisitAnalysisOverridesService } from '../analysis/visit-analysis-overrides.service';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { WorkerPoolService } from '../jobs/worker-pool.service';
import { JOB_QUEUE } from '../queue/job-queue';
import type { JobQueue, QueuedJob } from '../queue/job-queue';
import { RecordingsService } from '../recordings/recordings.service';
import {
  ANALYSIS_LANE,
  ComputationPayload,
  RecordingEvents,
} from '../recordings/recordings.events';
import { withExclusions } from './roi-exclusions';

/** How long a task job waits before looking again for its visit's resting result. */
const REST_WAIT_MS = 1000;
/** Progress reaches the queue at most this often per job (SSE listeners get every percent). */
const PROGRESS_WRITE_INTERVAL_MS = 500;

/**
 * Runs the analysis lane of the queue in the worker pool: claims a job per free thread, asks
 * the recording to become `computing`, computes with the visit's effective settings and its
 * resting IAF, stores the run, makes the recording `ready` and announces "visit results
 * changed". A task job waits while its visit's resting recording is still being computed, so
 * its band can follow the IAF; a task computed before the IAF arrived is computed again by
 * RestFollowListener.
 */
@Injectable()
export class ComputationsService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('Computations');
  private running = 0;
  private stopping = false;
  private pumping: Promise<void> | null = null;
  private pumpAgain = false;
  private wakeTimer: NodeJS.Timeout | null = null;
  private wakeAt = 0;
  private readonly inFlight = new Set<Promise<void>>();

  constructor(
    @Inject(JOB_QUEUE) private readonly queue: JobQueue,
    private readonly recordings: RecordingsService,
    private readonly overrides: VisitAnalysisOverridesService,
    private readonly runs: AnalysisRunsService,
    private readonly pool: WorkerPoolService,
    private readonly writes: WriteTransactions,
    private readonly events: EventEmitter2,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    await this.queue.recover();
    await this.recordings.reconcileAfterRestart();
    this.pump();
  }

  async onModuleDestroy(): Promise<void> {
    this.stopping = true;
    if (this.wakeTimer !== null) clearTimeout(this.wakeTimer);
    // Jobs still running stay `running` in the queue and are recovered at the next start.
    await Promise.race([Promise.allSettled([...this.inFlight]), delay(2000)]);
  }

  @OnEvent(RecordingEvents.ComputationQueued)
  onQueued(): void {
    this.pump();
  }

  /** Starts queued jobs while analysis threads are free. Safe to call at any time. */
  pump(): void {
    if (this.stopping) return;
    if (this.pumping !== null) {
      this.pumpAgain = true;
      return;
    }
    this.pumping = (async () => {
      do {
        this.pumpAgain = false;
        while (!this.stopping && this.running < this.pool.analysisThreads) {
          const job = await this.queue.claim<ComputationPayload>(ANALYSIS_LANE);
          if (job === null) {
            // Jobs released to wait for their visit's rest come due later: look again then.
            const dueInMs = await this.queue.nextDueInMs(ANALYSIS_LANE);
            if (dueInMs !== null) this.wakeIn(Math.max(dueInMs, 50));
            break;
          }
          if (await this.recordings.waitsForRest(job.payload.recordingId)) {
            await this.queue.release(job.id, REST_WAIT_MS);
            this.wakeIn(REST_WAIT_MS);
            continue;
          }
          this.running += 1;
          const done = this.execute(job).finally(() => {
            this.running -= 1;
            this.inFlight.delete(done);
            this.pump();
          });
          this.inFlight.add(done);
        }
      } while (this.pumpAgain && !this.stopping);
    })()
      .catch((error: unknown) => this.logger.error(`Queue pump failed: ${String(error)}`))
      .finally(() => {
        this.pumping = null;
      });
  }

  /** Resolves once the analysis lane has nothing queued or running (tests, orderly shutdowns). */
  async idle(timeoutMs = 120_000): Promise<void> {
    const until = Date.now() + timeoutMs;
    while (Date.now() < until) {
      if ((await this.queue.activeCount(ANALYSIS_LANE)) === 0 && this.running === 0) return;
      await delay(100);
    }
    throw new Error(`Computations still active after ${timeoutMs} ms`);
  }

  private async execute(job: QueuedJob<ComputationPayload>): Promise<void> {
    const input = await this.recordings.startComputing(job);
    if (input === null) {
      // The recording was replaced while its job waited: nothing to compute.
      await this.writes.run((tx) => this.queue.complete(tx, job.id));
      return;
    }
    const { recording } = input;
    const progress = this.progressWriter(job.id, recording.id);
    try {
      const effective = await this.overrides.effectiveFor(recording.studyId, recording.visitId);
      const iafHz =
        recording.kind === 'task' ? await this.runs.currentIafOfVisit(recording.visitId) : null;
      const outcome = await this.pool.analyze(
        {
          filePath: input.filePath,
          checksumSha256: recording.checksumSha256,
          kind: recording.kind,
          csvOnsets: input.csvOnsets,
          settings: effective.settings,
          iafHz,
        },
        progress.report,
      );
      await progress.stop();
      if (this.stopping) return;
      const exclusions = withExclusions(
        outcome.summary.roiUsage,
        valuesOf(effective.version).roi,
        effective.settings.roi,
      );
      outcome.summary.roiUsage = exclusions.usage;
      outcome.summary.quality.warnings.push(...exclusions.warnings);
      const { stored, ready } = await this.writes.run(async (tx) => {
        const stored = await this.runs.store(tx, {
          jobId: job.id,
          trigger: job.payload.trigger,
          recording,
          version: effective.version,
          settings: effective.settings,
          overrideRevision: effective.overrideRevision,
          iafHz,
          outcome,
        });
        const ready = await this.recordings.finishComputing(tx, recording.id, stored);
        await this.queue.complete(tx, job.id);
        return { stored, ready };
      });
      await this.recordings.announce([recording.id]);
      if (ready === null) return;
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
    } catch (error) {
      await progress.stop();
      if (this.stopping) return;
      // Errors cross the thread boundary as text; drop the class name piscina puts in front.
      const message = (error instanceof Error ? error.message : String(error)).replace(
        /^Error: /,
        '',
      );
      await this.fail(job, recording.id, message);
    }
  }

  private async fail(
    job: QueuedJob<ComputationPayload>,
    recordingId: string,
    message: string,
  ): Promise<void> {
    const error = `Attempt ${job.attempts} of ${job.maxAttempts} failed: ${message}`;
    this.logger.warn(`Job ${job.id} (recording ${recordingId}): ${error}`);
    await this.writes.run(async (tx) => {
      const outcome = await this.queue.fail(tx, job.id, error);
      await this.recordings.failComputing(tx, recordingId, outcome, error);
    });
    await this.recordings.announce([recordingId]);
  }

  /** Progress to SSE listeners on every whole percent, to the queue at most every 500 ms. */
  private progressWriter(
    jobId: string,
    recordingId: string,
  ): { report: (percent: number) => void; stop: () => Promise<void> } {
    let last = 0;
    let lastWrittenAt = 0;
    let stopped = false;
    let chain: Promise<unknown> = Promise.resolve();
    return {
      report: (value: number) => {
        const percent = Math.max(0, Math.min(99, Math.floor(value)));
        if (stopped || percent <= last) return;
        last = percent;
        this.recordings.emitProgress(recordingId, percent);
        const now = Date.now();
        if (now - lastWrittenAt < PROGRESS_WRITE_INTERVAL_MS) return;
        lastWrittenAt = now;
        chain = chain.then(() => this.queue.progress(jobId, percent).catch(() => undefined));
      },
      stop: async () => {
        stopped = true;
        await chain;
      },
    };
  }

  /** One timer, always set for the earliest wake-up anyone asked for. */
  private wakeIn(ms: number): void {
    if (this.stopping) return;
    const at = Date.now() + ms;
    if (this.wakeTimer !== null && this.wakeAt <= at) return;
    if (this.wakeTimer !== null) clearTimeout(this.wakeTimer);
    this.wakeAt = at;
    this.wakeTimer = setTimeout(() => {
      this.wakeTimer = null;
      this.pump();
    }, ms);
    this.wakeTimer.unref();
  }
}

function delay(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms).unref());
}
