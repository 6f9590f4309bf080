import { createHash, randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { mkdir, readdir, rename, rm, stat, unlink } from 'node:fs/promises';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { EventEmitter2 } from '@nestjs/event-emitter';
import { InjectDataSource } from '@nestjs/typeorm';
import { concat, from, Observable, of, takeWhile } from 'rxjs';
import { DataSource, EntityManager, FindOptionsWhere, In, Not } from 'typeorm';
import { SETTLED_RECORDING_STATES } from '@gyre/shared';
import type {
  Page,
  RecordingView,
  RecordingEvent,
  RecordingKind,
  RecordingRejection,
  RecordingState,
  RunTrigger,
} from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { blindedRecordingView } from '../blinding/blinded-views';
import { BlindingService } from '../blinding/blinding.service';
import type { AuditActor } from '../audit/audit.service';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { GyreException } from '../common/errors/gyre.exception';
import { isUniqueViolation } from '../common/errors/unique-violation';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { WorkerPoolService } from '../jobs/worker-pool.service';
import type { RecordingFacts } from '../jobs/worker/worker-tasks';
import { JOB_QUEUE } from '../queue/job-queue';
import type { FailOutcome, JobQueue, QueuedJob } from '../queue/job-queue';
import type { Visit } from '../visits/visit.entity';
import { RecordingListQueryDto } from './dto/recording-list-query.dto';
import { RecordingEventsService } from './recording-events.service';
import { RecordingLifecycle, type TransitionEntry } from './recording-lifecycle';
import { Recording } from './recording.entity';
import { toJobView, toRecordingView } from './recording-view';
import {
  ANALYSIS_LANE,
  ComputationInput,
  ComputationPayload,
  RecordingEvents,
  type RecordingSuperseded,
} from './recordings.events';
import { RecordingsError, recordingsError } from './recordings.errors';
import { kindMismatch, kindWarning } from './kind-check';
import { formError, StoredUpload } from './upload/upload-receiver';
import type { ReceivedFile } from './upload/multipart-upload';
import { errorMessage } from '../common/errors/error-message';

/** A file that passed the upload checks, ready to become a recording. */
export interface AcceptedFileCheck {
  ok: true;
  file: ReceivedFile;
  kind: RecordingKind;
  onsetsCsv: Buffer | null;
  facts: RecordingFacts;
  /** The file looks like the other kind and the kind was confirmed. */
  kindConfirmed: boolean;
  /** The standing warning of a confirmed kind. */
  warning: string | null;
}

/** What `RecordingsService.checkFile` found. */
export type FileCheck = AcceptedFileCheck | { ok: false; code: RecordingsError; message: string };

/** States in which a recording is the visit's current one of its kind. */
export const CURRENT_STATES: readonly RecordingState[] = ['queued', 'computing', 'ready', 'failed'];

/** Who asks for a computation, and why. */
export interface ComputationRequest {
  trigger: RunTrigger;
  actor: AuditActor | null;
  reason: string | null;
  clientIp?: string | null;
}

/** What a finished computation tells the recording. */
export interface ComputationResult {
  runId: string;
  stored: boolean;
  numbersChanged: boolean;
  roiUsage: unknown;
  warnings: string[];
}

const AUDIT_ACTION: Record<RunTrigger, string> = {
  upload: 'accept',
  rerun: 'rerun',
  retry: 'retry',
  'rest-changed': 'recompute',
  override: 'recompute',
  replacement: 'accept',
};

/**
 * A recording's whole life, and the only writer of its state (through RecordingLifecycle):
 * upload (stream → validate in the validation lane → accept or reject), the kind check and
 * explicit replacement, queueing computations, the moves the computation makes, recovery after
 * a restart, and what the API shows of it. Computations themselves run elsewhere (processing/).
 */
@Injectable()
export class RecordingsService {
  private readonly logger = new Logger('Recordings');

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(JOB_QUEUE) private readonly queue: JobQueue,
    private readonly writes: WriteTransactionsService,
    private readonly lifecycle: RecordingLifecycle,
    private readonly audit: AuditService,
    private readonly pool: WorkerPoolService,
    private readonly stateEvents: RecordingEventsService,
    private readonly events: EventEmitter2,
    private readonly blinding: BlindingService,
  ) {}

  async upload(caller: Caller, visit: Visit, upload: StoredUpload): Promise<RecordingView> {
    const tempPath = upload.file.tempPath;
    try {
      if (upload.onsetsCsv !== null && upload.kind !== 'task') {
        throw formError(
          'onsets',
          'an onset CSV with a resting recording',
          'onsets only beside a task recording',
        );
      }
      await this.assertKindFree(visit.id, upload);
      const row = await this.insertReceived(caller, visit, upload);
      const validating = await this.writes.run((tx) =>
        this.lifecycle.transition(tx, row, 'validating', {
          actor: caller.user,
          action: 'validate',
          clientIp: caller.clientIp,
        }),
      );
      this.emit(validating, null);
      const outcome = await this.pool
        .validate({
          filePath: tempPath,
          kind: upload.kind,
          onsetsCsv: upload.onsetsCsv === null ? null : upload.onsetsCsv.toString('utf8'),
        })
        .catch((error: unknown) => ({
          ok: false as const,
          message: `The file could not be checked: ${errorMessage(error)}`,
          field: null,
          found: null,
          expected: null,
        }));
      if (!outcome.ok) {
        const { ok: _ok, ...rejection } = outcome;
        const rejected = await this.reject(caller, validating, rejection);
        throw recordingsError(RecordingsError.Rejected, rejection.message, {
          ...rejection,
          recording: rejected,
        });
      }
      const mismatch = kindMismatch(upload.kind, outcome.facts.stimulusOnsetCount);
      if (mismatch !== null && !upload.confirmKind) {
        const rejected = await this.reject(caller, validating, mismatch.rejection);
        throw recordingsError(RecordingsError.KindUnconfirmed, mismatch.rejection.message, {
          ...mismatch.details,
          recording: rejected,
        });
      }
      return await this.accept(caller, validating, upload, outcome.facts, mismatch !== null);
    } finally {
      await unlink(tempPath).catch(() => undefined);
    }
  }

  async list(caller: Caller, query: RecordingListQueryDto): Promise<Page<RecordingView>> {
    const window = pageWindowOf(query, 'desc');
    const filters: Partial<
      Record<'visitId' | 'participantId' | 'siteId' | 'state' | 'kind', string>
    > = {};
    for (const key of ['visitId', 'participantId', 'siteId', 'state', 'kind'] as const) {
      const value = query[key];
      if (value !== undefined) filters[key] = value;
    }
    const where = { ...filters } as FindOptionsWhere<Recording>;
    // Blinded review: a participant's recordings list only the visits the analyst decided on.
    const open =
      filters.participantId === undefined ? null : await this.blinding.unblindedVisitIds(caller);
    if (open !== null) {
      where.visitId =
        filters.visitId === undefined ? In(open) : In(open.filter((id) => id === filters.visitId));
    }
    const [rows, total] = await this.dataSource.getRepository(Recording).findAndCount({
      where: scopedWhere<Recording>(caller.ability, 'read', 'Recording', where),
      ...pageSliceOf(window, query.sort ?? 'createdAt', window.order),
    });
    const views = await this.shownTo(caller, await this.views(rows));
    return toPage([views, total], window, (v) => v);
  }

  async get(caller: Caller, id: string): Promise<RecordingView> {
    const [view] = await this.shownTo(
      caller,
      await this.views([await this.findInScope(caller, id, 'read')]),
    );
    return view;
  }

  /** Blinded review: what an analyst may see of recordings of visits blinded for them. */
  private async shownTo(caller: Caller, views: RecordingView[]): Promise<RecordingView[]> {
    const blinded = await this.blinding.blindedVisits(caller, [
      ...new Set(views.map((v) => v.visitId)),
    ]);
    if (blinded.size === 0) return views;
    return views.map((v) => {
      const clock = blinded.get(v.visitId)?.clock;
      return clock === undefined ? v : blindedRecordingView(v, clock);
    });
  }

  /** The stored copy (patient field blanked) of an accepted recording, current or superseded. */
  async file(
    caller: Caller,
    id: string,
  ): Promise<{ stream: Readable; fileName: string; sizeBytes: number }> {
    const row = await this.findInScope(caller, id, 'read');
    const path = row.storedFile === null ? null : join(this.config.uploadsDir, row.storedFile);
    const found = path === null ? null : await stat(path).catch(() => null);
    if (path === null || found === null) {
      throw recordingsError(
        RecordingsError.FileMissing,
        `Recording ${id} has no stored file (${row.state === 'rejected' ? 'it was rejected: only its checksum and reason are kept' : 'not accepted yet'}).`,
        { recordingId: id, state: row.state },
      );
    }
    // Who took a copy of a recording is part of the trail, like every change.
    await this.audit.recordBy(caller, row, {
      action: 'download',
      objectType: 'Recording',
      objectId: row.id,
      after: { checksumSha256: row.checksumSha256, state: row.state },
    });
    return {
      stream: createReadStream(path),
      fileName: `gyre-${row.kind}-${row.id.slice(0, 8)}.edf`,
      sizeBytes: found.size,
    };
  }

  /** The recording's current state first, then every change until a settled state. */
  async events$(caller: Caller, id: string): Promise<Observable<RecordingEvent>> {
    const current = await this.get(caller, id);
    const first: RecordingEvent = {
      recordingId: id,
      state: current.state,
      progressPercent: current.progressPercent,
      error: current.failureMessage,
    };
    if (SETTLED_RECORDING_STATES.includes(current.state)) return of(first);
    return concat(
      from([first]),
      this.stateEvents
        .of(id)
        .pipe(takeWhile((event) => !SETTLED_RECORDING_STATES.includes(event.state), true)),
    );
  }

  /** A failed recording computed again with the current settings (technician or analyst). */
  async retry(caller: Caller, id: string): Promise<RecordingView> {
    const row = await this.findInScope(caller, id, 'retry');
    if (row.state !== 'failed') {
      throw recordingsError(
        RecordingsError.NotRetryable,
        `Only a failed recording can be retried; this one is ${row.state}.`,
        { state: row.state },
      );
    }
    await this.requestComputations([row], {
      trigger: 'retry',
      actor: caller.user,
      reason: null,
      clientIp: caller.clientIp,
    });
    return this.get(caller, id);
  }

  /**
   * Queues a computation of each recording (audited with the trigger). Refused for a recording
   * that has no accepted file, is superseded, or is already queued or computing.
   */
  async requestComputations(
    recordings: readonly Recording[],
    request: ComputationRequest,
  ): Promise<QueuedJob<ComputationPayload>[]> {
    const jobs = await this.writes.run(async (tx) => {
      const out: QueuedJob<ComputationPayload>[] = [];
      for (const stale of recordings) {
        const row = await tx.getRepository(Recording).findOneByOrFail({ id: stale.id });
        if (row.state === 'queued' || row.state === 'computing') {
          throw recordingsError(
            RecordingsError.AlreadyQueued,
            `Recording ${row.id} is already ${row.state}.`,
            { recordingId: row.id, state: row.state },
          );
        }
        if (row.state !== 'ready' && row.state !== 'failed') {
          throw recordingsError(
            RecordingsError.NotComputable,
            `Recording ${row.id} is ${row.state}: ${row.state === 'superseded' ? 'a newer recording replaced it' : 'there is no accepted file to compute'}.`,
            { recordingId: row.id, state: row.state },
          );
        }
        out.push(await this.queueComputation(tx, row, request));
      }
      return out;
    });
    await this.announce(jobs.map((job) => job.subjectId));
    this.events.emit(RecordingEvents.ComputationQueued);
    return jobs;
  }

  /** 404 when the recording does not exist or lies outside the caller's scope for `action`. */
  async findInScope(
    caller: Caller,
    id: string,
    action: 'read' | 'retry' | 'update' | 'rerun',
    subjectName: 'Recording' | 'Result' | 'AnalysisRun' = 'Recording',
  ): Promise<Recording> {
    const row = await this.dataSource.getRepository(Recording).findOne({
      where: scopedWhere<Recording>(caller.ability, action, subjectName, { id }),
    });
    if (row === null) {
      throw recordingsError(RecordingsError.NotFound, `No recording ${id}.`, {
        recordingId: id,
      });
    }
    return row;
  }

  /** The current recording of each kind of these visits (never a superseded or rejected one). */
  currentOfVisits(visitIds: readonly string[]): Promise<Recording[]> {
    if (visitIds.length === 0) return Promise.resolve([]);
    return this.dataSource.getRepository(Recording).find({
      where: { visitId: In([...visitIds]), state: In([...CURRENT_STATES]) },
      order: { createdAt: 'ASC' },
    });
  }

  /** Visits that have a current recording of this kind. */
  async visitsWithCurrentKind(kind: RecordingKind): Promise<string[]> {
    const rows: Array<{ visitId: string }> = await this.dataSource
      .getRepository(Recording)
      .createQueryBuilder('r')
      .select('DISTINCT r.visitId', 'visitId')
      .where('r.kind = :kind AND r.state IN (:...states)', { kind, states: CURRENT_STATES })
      .getRawMany();
    return rows.map((r) => r.visitId);
  }

  /**
   * Whether a task recording should wait: its visit's resting recording is still queued or
   * computing, and the task's band follows the IAF that computation will give.
   */
  async waitsForRest(recordingId: string): Promise<boolean> {
    const row = await this.dataSource
      .getRepository(Recording)
      .findOne({ where: { id: recordingId }, select: { id: true, kind: true, visitId: true } });
    if (row === null || row.kind !== 'task') return false;
    const count = await this.dataSource.getRepository(Recording).count({
      where: { visitId: row.visitId, kind: 'resting', state: In(['queued', 'computing']) },
    });
    return count > 0;
  }

  /**
   * The queued recording a claimed job is about becomes `computing`; null when it is no longer
   * queued (replaced meanwhile), so the job has nothing to do.
   */
  async startComputing(job: QueuedJob<ComputationPayload>): Promise<ComputationInput | null> {
    const input = await this.writes.run(async (tx) => {
      const row = await tx.getRepository(Recording).findOneBy({ id: job.payload.recordingId });
      if (row === null || row.state !== 'queued' || row.storedFile === null) return null;
      await this.lifecycle.transition(tx, row, 'computing', {
        actor: null,
        action: 'compute',
        after: { jobId: job.id, attempt: job.attempts, trigger: job.payload.trigger },
      });
      return toComputationInput(row, this.config.uploadsDir);
    });
    if (input !== null) await this.announce([input.recording.id]);
    return input;
  }

  /**
   * What a computation of a `computing` recording needs (handing a remote computation over
   * again, serving its file to a worker); null when the recording is not computing.
   */
  async computingInput(recordingId: string): Promise<ComputationInput | null> {
    const row = await this.dataSource.getRepository(Recording).findOneBy({ id: recordingId });
    if (row === null || row.state !== 'computing' || row.storedFile === null) return null;
    return toComputationInput(row, this.config.uploadsDir);
  }

  /** Inside the processing transaction: the computation's numbers are now the recording's. */
  async finishComputing(
    tx: EntityManager,
    recordingId: string,
    result: ComputationResult,
  ): Promise<Recording | null> {
    const row = await tx.getRepository(Recording).findOneBy({ id: recordingId });
    // Replaced while computing: its numbers are not the visit's any more.
    if (row === null || row.state !== 'computing') return null;
    return this.lifecycle.transition(
      tx,
      row,
      'ready',
      {
        actor: null,
        action: 'ready',
        after: {
          runId: result.runId,
          newRun: result.stored,
          numbersChanged: result.numbersChanged,
        },
        reason: result.stored ? null : 'the computation reproduced the current numbers exactly',
      },
      {
        latestRunId: result.runId,
        roiUsageJson: JSON.stringify(result.roiUsage),
        resultWarningsJson: JSON.stringify(result.warnings),
        failureMessage: null,
      },
    );
  }

  /** Inside the processing transaction: an attempt failed; queued again or failed for good. */
  async failComputing(
    tx: EntityManager,
    recordingId: string,
    outcome: FailOutcome,
    error: string,
  ): Promise<void> {
    const row = await tx.getRepository(Recording).findOneBy({ id: recordingId });
    if (row === null || row.state !== 'computing') return;
    await this.lifecycle.transition(
      tx,
      row,
      outcome.willRetry ? 'queued' : 'failed',
      {
        actor: null,
        action: outcome.willRetry ? 'attempt-failed' : 'fail',
        reason: error,
        after: { attempts: outcome.attempts, maxAttempts: outcome.maxAttempts },
      },
      { failureMessage: error },
    );
  }

  /**
   * After a restart (the queue has already settled the jobs a stopped server left running):
   * every recording still waiting or computing gets back in line with its job. A computing
   * recording follows its job (queued again, or failed after the last attempt); one whose job
   * finished or vanished without it, and a queued one without a live job, get a fresh job.
   */
  async reconcileAfterRestart(): Promise<void> {
    const waiting = await this.dataSource
      .getRepository(Recording)
      .find({ where: { state: In(['queued', 'computing']) } });
    if (waiting.length === 0) return;
    const jobs = await this.queue.latestBySubject(waiting.map((r) => r.id));
    let requeued = 0;
    await this.writes.run(async (tx) => {
      for (const stale of waiting) {
        const row = await tx.getRepository(Recording).findOneByOrFail({ id: stale.id });
        const job = jobs.get(row.id);
        const live = job !== undefined && (job.state === 'queued' || job.state === 'running');
        const reason = job?.error ?? 'the server stopped during the computation';
        // Still running after the queue's recovery: a remote worker computes it (REDIS_URL).
        if (row.state === 'computing' && job?.state === 'running') continue;
        if (row.state === 'computing' && job?.state === 'failed') {
          await this.lifecycle.transition(
            tx,
            row,
            'failed',
            { actor: null, action: 'fail', reason },
            { failureMessage: reason },
          );
          continue;
        }
        if (row.state === 'computing') {
          await this.lifecycle.transition(tx, row, 'queued', {
            actor: null,
            action: 'attempt-failed',
            reason,
          });
        }
        if (!live) {
          await this.queue.enqueue<ComputationPayload>(tx, {
            lane: ANALYSIS_LANE,
            subjectId: row.id,
            payload: { recordingId: row.id, trigger: 'retry', requestedById: null, reason: null },
          });
          requeued += 1;
        }
      }
    });
    if (requeued > 0) this.logger.warn(`Queued ${requeued} recording(s) again after a restart`);
  }

  async views(rows: Recording[]): Promise<RecordingView[]> {
    if (rows.length === 0) return [];
    const jobs = await this.queue.latestBySubject(rows.map((r) => r.id));
    return rows.map((row) => {
      const job = jobs.get(row.id) as QueuedJob<ComputationPayload> | undefined;
      return toRecordingView(row, job === undefined ? null : toJobView(job));
    });
  }

  /**
   * Uploads cut short by a restart: their temporary files are gone with the request, and a
   * stored file that no accepted recording names (the stop fell between storing the file and
   * the transaction that accepts it) is removed.
   */
  async recoverInterruptedUploads(tempDir: string): Promise<void> {
    await rm(tempDir, { recursive: true, force: true });
    const stored = await readdir(this.config.uploadsDir).catch(() => [] as string[]);
    // Only Gyre's own stored files (named by their SHA-256); anything else is not ours to remove.
    for (const name of stored.filter((n) => /^[0-9a-f]{64}\.edf$/.test(n))) {
      if (await this.removeIfUnreferenced(name)) {
        this.logger.warn(`Removed ${name}: no accepted recording names it (interrupted upload)`);
      }
    }
    const stale = await this.dataSource
      .getRepository(Recording)
      .find({ where: { state: In(['received', 'validating']) } });
    for (const row of stale) {
      await this.writes.run((tx) =>
        this.lifecycle.transition(
          tx,
          row,
          'rejected',
          {
            actor: null,
            action: 'reject',
            reason: 'upload interrupted by a restart',
            after: { checksumSha256: row.checksumSha256 },
          },
          {
            rejectionJson: JSON.stringify({
              message:
                'The upload was interrupted by a server restart before it was accepted; upload it again.',
              field: null,
              found: null,
              expected: null,
            } satisfies RecordingRejection),
          },
        ),
      );
    }
    if (stale.length > 0) this.logger.warn(`${stale.length} interrupted upload(s) marked rejected`);
  }

  /** Tells state listeners (SSE) the committed state of these recordings. */
  async announce(ids: readonly string[]): Promise<void> {
    if (ids.length === 0) return;
    const rows = await this.dataSource
      .getRepository(Recording)
      .find({ where: { id: In([...ids]) } });
    for (const row of rows) this.emit(row, row.state === 'failed' ? row.failureMessage : null);
  }

  /** Progress of a computing recording, for SSE only. */
  emitProgress(recordingId: string, percent: number): void {
    this.stateEvents.emit({
      recordingId,
      state: 'computing',
      progressPercent: percent,
      error: null,
    });
  }

  /**
   * 409 for the same file again in the visit, or when the visit has a current recording of
   * the kind that the upload does not explicitly replace.
   */
  private async assertKindFree(visitId: string, upload: StoredUpload): Promise<void> {
    const duplicate = await this.dataSource.getRepository(Recording).findOne({
      where: { visitId, checksumSha256: upload.file.sha256, state: Not('rejected') },
    });
    if (duplicate !== null) throw duplicateError(duplicate.id, upload.file.sha256);
    const current = await this.dataSource.getRepository(Recording).findOne({
      where: { visitId, kind: upload.kind, state: In([...CURRENT_STATES]) },
    });
    if (current === null && upload.replaces === null) return;
    if (current === null || upload.replaces === null) {
      throw current === null
        ? recordingsError(
            RecordingsError.ReplacementInvalid,
            `replaces: recording ${upload.replaces?.recordingId} is not this visit's current ${upload.kind} recording (there is none).`,
            { field: 'replaces', recordingId: upload.replaces?.recordingId ?? null },
          )
        : recordingsError(
            RecordingsError.KindTaken,
            `This visit already has a ${upload.kind} recording (${current.id}, ${current.state}). Replace it explicitly, with a reason, or upload to another visit.`,
            { kind: upload.kind, recordingId: current.id },
          );
    }
    if (current.id !== upload.replaces.recordingId) {
      throw recordingsError(
        RecordingsError.ReplacementInvalid,
        `replaces: recording ${upload.replaces.recordingId} found, the visit's current ${upload.kind} recording ${current.id} expected.`,
        { field: 'replaces', recordingId: upload.replaces.recordingId, currentId: current.id },
      );
    }
  }

  private async insertReceived(
    caller: Caller,
    visit: Visit,
    upload: StoredUpload,
  ): Promise<Recording> {
    const row = receivedRow(caller, visit, upload);
    await this.writes.run(async (tx) => {
      const duplicate = await tx.getRepository(Recording).findOne({
        where: { visitId: visit.id, checksumSha256: row.checksumSha256, state: Not('rejected') },
      });
      if (duplicate !== null) throw duplicateError(duplicate.id, row.checksumSha256);
      await this.lifecycle.create(tx, row, uploadEntry(caller, row));
    });
    this.emit(row, null);
    return row;
  }

  private async reject(
    caller: Caller,
    row: Recording,
    rejection: RecordingRejection,
  ): Promise<RecordingView> {
    const rejected = await this.writes.run((tx) =>
      this.lifecycle.transition(
        tx,
        row,
        'rejected',
        {
          actor: caller.user,
          action: 'reject',
          reason: rejection.message,
          clientIp: caller.clientIp,
          after: { checksumSha256: row.checksumSha256, rejection },
        },
        { rejectionJson: JSON.stringify(rejection) },
      ),
    );
    this.emit(rejected, rejection.message);
    const [view] = await this.views([rejected]);
    return view;
  }

  private async accept(
    caller: Caller,
    row: Recording,
    upload: StoredUpload,
    facts: RecordingFacts,
    kindConfirmed: boolean,
  ): Promise<RecordingView> {
    const storedFile = `${row.checksumSha256}.edf`;
    const placed = await this.storeByContent(upload.file.tempPath, row.checksumSha256);
    const superseded: string[] = [];
    let queued: Recording;
    try {
      queued = await this.writes.run(async (tx) => {
        if (upload.replaces !== null) {
          const earlier = await tx
            .getRepository(Recording)
            .findOneByOrFail({ id: upload.replaces.recordingId });
          await this.lifecycle.transition(
            tx,
            earlier,
            'superseded',
            {
              actor: caller.user,
              action: 'supersede',
              reason: upload.replaces.reason,
              clientIp: caller.clientIp,
              after: { supersededById: row.id },
            },
            { supersededById: row.id },
          );
          superseded.push(earlier.id);
        }
        return this.queueAccepted(tx, caller, row, {
          facts,
          storedFile,
          kindConfirmed,
          warning: kindConfirmed ? kindWarning(row.kind, facts.stimulusOnsetCount) : null,
          trigger: upload.replaces === null ? 'upload' : 'replacement',
          reason: upload.replaces?.reason ?? null,
        });
      });
    } catch (error) {
      // Nothing of a refused upload stays: the file goes unless another recording names it.
      if (placed) await this.removeIfUnreferenced(storedFile);
      // Another upload of this kind was accepted for the visit meanwhile.
      if (!isUniqueViolation(error)) throw error;
      const rejection: RecordingRejection = {
        message: `Another ${row.kind} recording was accepted for this visit while this one was checked; replace it explicitly if this file should count.`,
        field: 'kind',
        found: row.kind,
        expected: 'one current recording of each kind per visit',
      };
      const rejected = await this.reject(caller, row, rejection);
      throw recordingsError(RecordingsError.KindTaken, rejection.message, {
        kind: row.kind,
        recording: rejected,
      });
    }
    await this.announce([...superseded, queued.id]);
    this.events.emit(RecordingEvents.ComputationQueued);
    if (superseded.length > 0) {
      this.events.emit(RecordingEvents.Superseded, {
        visitId: row.visitId,
        kind: row.kind,
      } satisfies RecordingSuperseded);
    }
    const [view] = await this.views([queued]);
    return view;
  }

  /** Deletes a stored file that no accepted (non-rejected) recording names; true if deleted. */
  private async removeIfUnreferenced(storedFile: string): Promise<boolean> {
    const named = await this.dataSource
      .getRepository(Recording)
      .count({ where: { storedFile, state: Not('rejected') } });
    if (named > 0) return false;
    await unlink(join(this.config.uploadsDir, storedFile)).catch(() => undefined);
    return true;
  }

  private async queueComputation(
    tx: EntityManager,
    row: Recording,
    request: ComputationRequest,
  ): Promise<QueuedJob<ComputationPayload>> {
    await this.lifecycle.transition(tx, row, 'queued', {
      actor: request.actor,
      action: AUDIT_ACTION[request.trigger],
      reason: request.reason,
      clientIp: request.clientIp ?? null,
      after: { trigger: request.trigger, automatic: request.actor === null },
    });
    return this.queue.enqueue<ComputationPayload>(tx, {
      lane: ANALYSIS_LANE,
      subjectId: row.id,
      payload: {
        recordingId: row.id,
        trigger: request.trigger,
        requestedById: request.actor?.id ?? null,
        reason: request.reason,
      },
    });
  }

  // ---- Bulk upload (bulk-uploads/): the same checks and writes, split so that nothing of a
  // refused batch is created. The bulk module decides; this module still writes every row.

  /**
   * Checks a received file exactly as an upload is checked (the validation lane, then the
   * kind check) without creating a recording or writing anything.
   */
  async checkFile(
    file: ReceivedFile,
    kind: RecordingKind,
    onsetsCsv: Buffer | null,
    confirmKind: boolean,
  ): Promise<FileCheck> {
    const outcome = await this.pool
      .validate({
        filePath: file.tempPath,
        kind,
        onsetsCsv: onsetsCsv === null ? null : onsetsCsv.toString('utf8'),
      })
      .catch((error: unknown) => ({
        ok: false as const,
        message: `The file could not be checked: ${errorMessage(error)}`,
      }));
    if (!outcome.ok) return { ok: false, code: RecordingsError.Rejected, message: outcome.message };
    const mismatch = kindMismatch(kind, outcome.facts.stimulusOnsetCount);
    if (mismatch !== null && !confirmKind) {
      return {
        ok: false,
        code: RecordingsError.KindUnconfirmed,
        message: mismatch.rejection.message,
      };
    }
    return {
      ok: true,
      file,
      kind,
      onsetsCsv,
      facts: outcome.facts,
      kindConfirmed: mismatch !== null,
      warning: mismatch === null ? null : kindWarning(kind, outcome.facts.stimulusOnsetCount),
    };
  }

  /**
   * Why a file of `kind` cannot join the visit without a replacement (the same file is
   * already there, or the visit has a current recording of the kind); null when it can.
   */
  async conflictWithVisit(
    visitId: string,
    kind: RecordingKind,
    sha256: string,
  ): Promise<string | null> {
    const duplicate = await this.dataSource.getRepository(Recording).findOne({
      where: { visitId, checksumSha256: sha256, state: Not('rejected') },
    });
    if (duplicate !== null) return duplicateError(duplicate.id, sha256).message;
    const current = await this.dataSource.getRepository(Recording).findOne({
      where: { visitId, kind, state: In([...CURRENT_STATES]) },
    });
    return current === null
      ? null
      : `The visit already has a current ${kind} recording (${current.id}, ${current.state}); a bulk upload does not replace recordings: replace it with a single upload, with a reason.`;
  }

  /**
   * One write transaction for a bulk entry point: `write` creates the accepted recordings
   * (`createAccepted`) with whatever goes with them and returns their ids; the files of
   * `checks` are put in place as its last step, so a crash before the commit leaves only files
   * that start-up removes (no recording names them). On a rollback the files this put there
   * are removed again, `rolledBack` runs, and a unique violation (another upload created the
   * same rows meanwhile) becomes `conflict()`; after the commit listeners hear of the
   * recordings.
   */
  async acceptInOneTransaction(options: {
    checks: readonly AcceptedFileCheck[];
    write: (tx: EntityManager) => Promise<string[]>;
    rolledBack: () => void;
    conflict: () => GyreException;
  }): Promise<void> {
    const placed: string[] = [];
    let recordingIds: string[] = [];
    try {
      await this.writes.run(async (tx) => {
        recordingIds = await options.write(tx);
        for (const check of options.checks) {
          if (await this.storeByContent(check.file.tempPath, check.file.sha256)) {
            placed.push(check.file.sha256);
          }
        }
      });
    } catch (error) {
      for (const sha of placed) await this.removeIfUnreferenced(`${sha}.edf`);
      options.rolledBack();
      if (isUniqueViolation(error)) throw options.conflict();
      throw error;
    }
    await this.announce(recordingIds);
    if (recordingIds.length > 0) this.events.emit(RecordingEvents.ComputationQueued);
  }

  /**
   * Moves a checked file to `uploads/<checksum>.edf`, named by content: the same file in
   * another visit is already there, byte for byte, and is kept. Returns whether this call put
   * it there, so a rollback can take it away.
   */
  private async storeByContent(tempPath: string, sha256: string): Promise<boolean> {
    const target = join(this.config.uploadsDir, `${sha256}.edf`);
    await mkdir(this.config.uploadsDir, { recursive: true });
    const exists = await stat(target).then(
      () => true,
      () => false,
    );
    if (!exists) await rename(tempPath, target);
    return !exists;
  }

  /**
   * Inside the `write` of `acceptInOneTransaction`: a checked file becomes the visit's queued
   * recording with its job, through the same moves and audit entries as a single upload
   * (upload, validate, accept); the file itself is stored there before the commit.
   */
  async createAccepted(
    tx: EntityManager,
    caller: Caller,
    visit: Pick<Visit, 'id' | 'studyId' | 'siteId' | 'participantId'>,
    check: AcceptedFileCheck,
    /** What the file's source declared of the power line (EEG-BIDS sidecar), when it did. */
    lineFrequencyHz: 50 | 60 | null = null,
  ): Promise<Recording> {
    const upload: StoredUpload = {
      file: check.file,
      onsetsCsv: check.onsetsCsv,
      kind: check.kind,
      confirmKind: check.kindConfirmed,
      replaces: null,
    };
    const row = receivedRow(caller, visit, upload);
    row.lineFrequencyHz = lineFrequencyHz;
    await this.lifecycle.create(tx, row, uploadEntry(caller, row, { lineFrequencyHz, bulk: true }));
    await this.lifecycle.transition(tx, row, 'validating', {
      actor: caller.user,
      action: 'validate',
      clientIp: caller.clientIp,
    });
    return this.queueAccepted(tx, caller, row, {
      facts: check.facts,
      storedFile: `${row.checksumSha256}.edf`,
      kindConfirmed: check.kindConfirmed,
      warning: check.warning,
      trigger: 'upload',
      reason: null,
    });
  }

  /**
   * Inside `tx`: a validated recording becomes `queued` with its stored file and facts (the
   * `accept` entry, a kind warning its reason), and its computation joins the analysis lane.
   */
  private async queueAccepted(
    tx: EntityManager,
    caller: Caller,
    row: Recording,
    accepted: {
      facts: RecordingFacts;
      storedFile: string;
      kindConfirmed: boolean;
      warning: string | null;
      trigger: 'upload' | 'replacement';
      reason: string | null;
    },
  ): Promise<Recording> {
    const { csvOnsets, ...rest } = accepted.facts;
    const { facts, kindConfirmed } = accepted;
    const queued = await this.lifecycle.transition(
      tx,
      row,
      'queued',
      {
        actor: caller.user,
        action: 'accept',
        clientIp: caller.clientIp,
        reason: accepted.warning,
        after: {
          durationS: facts.durationS,
          channels: facts.channelLabels.length,
          stimulusOnsetCount: facts.stimulusOnsetCount,
          csvOnsetCount: csvOnsets?.length ?? null,
          kindConfirmed,
        },
      },
      {
        storedFile: accepted.storedFile,
        factsJson: JSON.stringify(rest),
        csvOnsetsJson: csvOnsets === null ? null : JSON.stringify(csvOnsets),
        kindConfirmed,
      },
    );
    await this.queue.enqueue<ComputationPayload>(tx, {
      lane: ANALYSIS_LANE,
      subjectId: row.id,
      payload: {
        recordingId: row.id,
        trigger: accepted.trigger,
        requestedById: caller.user.id,
        reason: accepted.reason,
      },
    });
    return queued;
  }

  private emit(row: Recording, error: string | null): void {
    this.stateEvents.emit({ recordingId: row.id, state: row.state, progressPercent: null, error });
  }
}

/** A new recording row, `received`, of this upload to this visit. */
/**
 * The audit entry of an upload: what was stored for which visit, what it replaces and why
 * (`extra`: what a bulk import adds).
 */
function uploadEntry(
  caller: Caller,
  row: Recording,
  extra: Record<string, unknown> = {},
): TransitionEntry {
  return {
    actor: caller.user,
    action: 'upload',
    clientIp: caller.clientIp,
    after: {
      kind: row.kind,
      visitId: row.visitId,
      checksumSha256: row.checksumSha256,
      sizeBytes: row.sizeBytes,
      onsetsChecksumSha256: row.onsetsChecksumSha256,
      ...extra,
      replacesId: row.replacesId,
    },
    reason: row.replacementReason,
  };
}

function receivedRow(
  caller: Caller,
  visit: Pick<Visit, 'id' | 'studyId' | 'siteId' | 'participantId'>,
  upload: StoredUpload,
): Recording {
  const now = new Date().toISOString();
  return Object.assign(new Recording(), {
    id: randomUUID(),
    studyId: visit.studyId,
    siteId: visit.siteId,
    participantId: visit.participantId,
    visitId: visit.id,
    kind: upload.kind,
    state: 'received' as const,
    checksumSha256: upload.file.sha256,
    sizeBytes: upload.file.sizeBytes,
    fileName: upload.file.originalName ?? null,
    lineFrequencyHz: null,
    storedFile: null,
    factsJson: null,
    csvOnsetsJson: null,
    onsetsChecksumSha256:
      upload.onsetsCsv === null
        ? null
        : createHash('sha256').update(upload.onsetsCsv).digest('hex'),
    rejectionJson: null,
    kindConfirmed: false,
    replacesId: upload.replaces?.recordingId ?? null,
    replacementReason: upload.replaces?.reason ?? null,
    supersededById: null,
    latestRunId: null,
    roiUsageJson: null,
    resultWarningsJson: null,
    failureMessage: null,
    uploadedById: caller.user.id,
    createdAt: now,
    updatedAt: now,
  });
}

function duplicateError(recordingId: string, checksumSha256: string): GyreException {
  return recordingsError(
    RecordingsError.Duplicate,
    `This file (SHA-256 ${checksumSha256}) is already recording ${recordingId} of this visit.`,
    { recordingId, checksumSha256 },
  );
}

function toComputationInput(row: Recording, uploadsDir: string): ComputationInput {
  return {
    recording: row,
    filePath: join(uploadsDir, row.storedFile ?? ''),
    csvOnsets:
      row.csvOnsetsJson === null
        ? null
        : (JSON.parse(row.csvOnsetsJson) as Array<{ onsetS: number; label: string }>),
  };
}
