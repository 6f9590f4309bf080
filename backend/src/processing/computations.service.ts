import {
  Inject,
  Injectable,
  Logger,
  OnApplicationBootstrap,
  OnModuleDestroy,
} from '@nestjs/common';
import { OnEvent } from '@nestjs/event-emitter';
import { WorkerPoolService } from '../jobs/worker-pool.service';
import { JOB_QUEUE } from '../queue/job-queue';
import type { JobQueue, QueuedJob } from '../queue/job-queue';
import { LanePump } from '../queue/lane-pump';
import { RecordingsService } from '../recordings/recordings.service';
import {
  ANALYSIS_LANE,
  ComputationPayload,
  RecordingEvents,
} from '../recordings/recordings.events';
import type { AttemptRef } from '../remote-workers/remote-job';
import { ComputationStepsService } from './computation-steps.service';
import { RemoteComputationsService } from './remote-computations.service';
import { threadErrorMessage } from '../common/errors/error-message';

/** How long a task job waits before looking again for its visit's resting result. */
const REST_WAIT_MS = 1000;
/** Progress reaches the queue at most this often per job (SSE listeners get every percent). */
const PROGRESS_WRITE_INTERVAL_MS = 500;

/** What the comparison of running jobs with Redis found to do. */
interface RemotePlan {
  /** Still computed elsewhere: they stay `running`. */
  keep: Set<string>;
  /** Lost by Redis while their recording computes: handed over again (same attempt). */
  redispatch: Array<QueuedJob<ComputationPayload>>;
  /** Given up by BullMQ, or finished without a result: the attempt failed. */
  fail: Array<{ ref: AttemptRef; reason: string }>;
  /** Lost before their recording started computing. */
  unstarted: Array<QueuedJob<ComputationPayload>>;
}

/**
 * Runs the analysis lane of the queue: claims jobs, asks the recording to become `computing`,
 * computes with the visit's effective settings and its resting IAF, stores the run, makes the
 * recording `ready` and announces "visit results changed" (the steps: computation-steps.ts).
 * Without REDIS_URL the computing happens here, one job per free worker thread. With it, each
 * claimed job is handed to BullMQ (up to REMOTE_DISPATCH_LIMIT at once) and remote workers
 * post results through the worker API; the SQLite job stays the record, and a periodic check
 * hands over again what Redis lost and fails what BullMQ gave up. A task job waits while its
 * visit's resting recording is still being computed, so its band can follow the IAF; a task
 * computed before the IAF arrived is computed again by RestFollowListener.
 */
@Injectable()
export class ComputationsService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('Computations');
  private running = 0;
  private stopping = false;
  private readonly lanePump = new LanePump({
    drain: () => this.drain(),
    stopping: () => this.stopping,
    onError: (error) => this.logger.error(`Queue pump failed: ${String(error)}`),
  });
  private wakeTimer: NodeJS.Timeout | null = null;
  private wakeAt = 0;
  private readonly inFlight = new Set<Promise<void>>();
  /** Jobs claimed and being handed to Redis right now: the check leaves them alone. */
  private readonly dispatching = new Set<string>();
  private checkTimer: NodeJS.Timeout | null = null;
  private checkSoonTimer: NodeJS.Timeout | null = null;
  private checking: Promise<void> | null = null;

  constructor(
    @Inject(JOB_QUEUE) private readonly queue: JobQueue,
    private readonly recordings: RecordingsService,
    private readonly steps: ComputationStepsService,
    private readonly pool: WorkerPoolService,
    private readonly remote: RemoteComputationsService,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    if (this.remote.enabled) {
      await this.startRemote();
    } else {
      await this.queue.recover();
      await this.recordings.reconcileAfterRestart();
    }
    this.pump();
  }

  async onModuleDestroy(): Promise<void> {
    this.stopping = true;
    for (const timer of [this.wakeTimer, this.checkSoonTimer]) {
      if (timer !== null) clearTimeout(timer);
    }
    if (this.checkTimer !== null) clearInterval(this.checkTimer);
    // Jobs still running stay `running` in the queue and are recovered at the next start.
    await Promise.race([Promise.allSettled([...this.inFlight, this.checking]), delay(2000)]);
  }

  @OnEvent(RecordingEvents.ComputationQueued)
  onQueued(): void {
    this.pump();
  }

  /** Starts queued jobs while there is room (free threads, or the dispatch limit). Safe any time. */
  pump(): void {
    this.lanePump.run();
  }

  private async drain(): Promise<void> {
    while (!this.stopping && (await this.hasRoom())) {
      const job = await this.queue.claim<ComputationPayload>(ANALYSIS_LANE);
      if (job === null) {
        // Jobs released to wait for their visit's rest come due later: look again then.
        const dueInMs = await this.queue.nextDueInMs(ANALYSIS_LANE);
        if (dueInMs !== null) this.wakeIn(Math.max(dueInMs, 50));
        return;
      }
      if (await this.recordings.waitsForRest(job.payload.recordingId)) {
        await this.queue.release(job.id, REST_WAIT_MS);
        this.wakeIn(REST_WAIT_MS);
        continue;
      }
      if (this.remote.enabled) this.track(this.dispatch(job), job.id);
      else this.track(this.execute(job));
    }
  }

  /** Resolves once the analysis lane has nothing queued or running (tests, orderly shutdowns). */
  async idle(timeoutMs = 120_000): Promise<void> {
    const until = Date.now() + timeoutMs;
    while (Date.now() < until) {
      const active = await this.queue.activeCount(ANALYSIS_LANE);
      if (active === 0 && this.running === 0 && this.inFlight.size === 0) return;
      await delay(100);
    }
    throw new Error(`Computations still active after ${timeoutMs} ms`);
  }

  /** Soon compare running jobs with Redis (after a failure event; coalesces bursts). */
  checkSoon(): void {
    if (this.stopping || !this.remote.enabled || this.checkSoonTimer !== null) return;
    this.checkSoonTimer = setTimeout(() => {
      this.checkSoonTimer = null;
      void this.checkRemote();
    }, 200);
    this.checkSoonTimer.unref();
  }

  private async hasRoom(): Promise<boolean> {
    if (!this.remote.enabled) return this.running < this.pool.analysisThreads;
    const running = await this.queue.running(ANALYSIS_LANE);
    return running.length < this.remote.dispatchLimit;
  }

  private track(work: Promise<void>, dispatchingId?: string): void {
    if (dispatchingId !== undefined) this.dispatching.add(dispatchingId);
    this.running += 1;
    const done = work
      .catch((error: unknown) => this.logger.error(`Computation step failed: ${String(error)}`))
      .finally(() => {
        this.running -= 1;
        if (dispatchingId !== undefined) this.dispatching.delete(dispatchingId);
        this.inFlight.delete(done);
        this.pump();
      });
    this.inFlight.add(done);
  }

  /** In this process: the computation on a worker thread, then its result or failure stored. */
  private async execute(job: QueuedJob<ComputationPayload>): Promise<void> {
    const prepared = await this.steps.prepare(job);
    if (prepared === null) return;
    const { input, context } = prepared;
    const ref = { jobId: job.id, attempt: job.attempts };
    const progress = this.progressWriter(job.id, input.recording.id);
    try {
      const outcome = await this.pool.analyze(
        {
          filePath: input.filePath,
          checksumSha256: input.recording.checksumSha256,
          kind: input.recording.kind,
          csvOnsets: input.csvOnsets,
          settings: context.settings,
          iafHz: context.iafHz,
        },
        progress.report,
      );
      await progress.stop();
      if (this.stopping) return;
      await this.steps.finish(ref, context, outcome);
    } catch (error) {
      await progress.stop();
      if (this.stopping) return;
      const message = threadErrorMessage(error);
      await this.steps.failAttempt(ref, message);
    }
  }

  /** With Redis: the prepared computation goes to BullMQ; a worker posts its result later. */
  private async dispatch(job: QueuedJob<ComputationPayload>): Promise<void> {
    const prepared = await this.steps.prepare(job);
    if (prepared === null) return;
    try {
      await this.remote.dispatch(this.steps.remoteJobData(prepared));
    } catch (error) {
      // The job stays running; the next check finds it missing in Redis and hands it over.
      this.logger.warn(`Job ${job.id} not handed to Redis yet: ${String(error)}`);
    }
  }

  /**
   * At a start with Redis: running jobs whose BullMQ job still exists stay in flight (a worker
   * computes them or will), lost ones are handed over again, given-up ones count as failed
   * attempts; only jobs claimed but never started are settled as the SQLite queue settles them.
   */
  private async startRemote(): Promise<void> {
    await this.remote.start(() => this.checkSoon());
    const plan = await this.planRemote(await this.queue.running(ANALYSIS_LANE));
    await this.queue.recover({ stillRunning: plan.keep });
    await this.recordings.reconcileAfterRestart();
    await this.settleRemote({ ...plan, unstarted: [] });
    this.checkTimer = setInterval(() => void this.checkRemote(), this.remote.checkIntervalMs);
    this.checkTimer.unref();
  }

  /** While serving: the same comparison, for jobs not being handed over right now. */
  private async checkRemote(): Promise<void> {
    if (this.stopping || this.checking !== null) return;
    this.checking = (async () => {
      const running = await this.queue.running<ComputationPayload>(ANALYSIS_LANE);
      const plan = await this.planRemote(running.filter((job) => !this.dispatching.has(job.id)));
      await this.settleRemote(plan);
    })()
      .catch((error: unknown) => this.logger.warn(`Check against Redis failed: ${String(error)}`))
      .finally(() => {
        this.checking = null;
        this.pump();
      });
    await this.checking;
  }

  private async planRemote(running: Array<QueuedJob<ComputationPayload>>): Promise<RemotePlan> {
    const plan: RemotePlan = { keep: new Set(), redispatch: [], fail: [], unstarted: [] };
    for (const job of running) {
      const ref = { jobId: job.id, attempt: job.attempts };
      const state = await this.remote.state(ref);
      if (state.kind === 'in-flight') {
        plan.keep.add(job.id);
      } else if (state.kind === 'gone') {
        const computing = await this.recordings.computingInput(job.payload.recordingId);
        if (computing === null) {
          plan.unstarted.push(job);
        } else {
          plan.keep.add(job.id);
          plan.redispatch.push(job);
        }
      } else {
        plan.keep.add(job.id);
        plan.fail.push({
          ref,
          reason:
            state.kind === 'failed'
              ? `the worker queue gave up: ${state.reason}`
              : 'the worker finished without delivering a result',
        });
      }
    }
    return plan;
  }

  private async settleRemote(plan: RemotePlan): Promise<void> {
    for (const job of plan.redispatch) {
      const input = await this.recordings.computingInput(job.payload.recordingId);
      if (input === null) continue;
      const context = await this.steps.contextFor(input.recording);
      await this.remote.redispatch(this.steps.remoteJobData({ job, input, context }));
      this.logger.warn(`Job ${job.id} attempt ${job.attempts} was not in Redis: handed over again`);
    }
    for (const { ref, reason } of plan.fail) await this.steps.failAttempt(ref, reason);
    for (const job of plan.unstarted) {
      await this.steps.failAttempt(
        { jobId: job.id, attempt: job.attempts },
        'lost before its computation started',
      );
    }
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
