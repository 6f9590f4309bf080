import { createHash, randomUUID } from 'node:crypto';
import { mkdir, rename, rm, stat, unlink } from 'node:fs/promises';
import { join } from 'node:path';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Request } from 'express';
import { concat, from, Observable, of, takeWhile } from 'rxjs';
import { DataSource, EntityManager, FindOptionsWhere, In, Not } from 'typeorm';
import { RECORDING_KINDS } from '@gyre/shared';
import type {
  Page,
  RecordingDto,
  RecordingEvent,
  RecordingKind,
  RecordingRejection,
  RecordingState,
} from '@gyre/shared';
import { AnalysisRun } from '../analysis/analysis-run.entity';
import { AnalysisSettings } from '../analysis/analysis-settings.entity';
import { AuditService } from '../audit/audit.service';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { Job } from '../jobs/job.entity';
import { JobsService } from '../jobs/jobs.service';
import { RecordingEventsService } from '../jobs/recording-events.service';
import { WorkerPoolService } from '../jobs/worker-pool.service';
import type { RecordingFacts } from '../jobs/worker/worker-tasks';
import { Visit } from '../visits/visit.entity';
import { RecordingListQueryDto } from './dto/recording-list-query.dto';
import { Recording } from './recording.entity';
import { toJobDto, toRecordingDto } from './recording.view';
import { RecordingsError } from './recordings.errors';
import {
  receiveUpload,
  ReceivedUpload,
  UploadFormError,
  UploadTooLargeError,
} from './upload/multipart-upload';

const MAX_ONSETS_CSV_BYTES = 4 * 1024 * 1024;
const TERMINAL: readonly RecordingState[] = ['ready', 'rejected', 'failed'];

/**
 * Uploads and the recordings they create. An upload streams to a temporary file with the
 * patient field blanked (see PatientFieldBlanker), is checked completely by the signal core
 * in a worker thread, and only then becomes `queued` under `uploads/<checksum>.edf`; a bad
 * file becomes `rejected` with the reader's message, and nothing of it is kept.
 */
@Injectable()
export class RecordingsService {
  private readonly logger = new Logger('Recordings');

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly writes: WriteTransactions,
    private readonly audit: AuditService,
    private readonly pool: WorkerPoolService,
    private readonly jobs: JobsService,
    private readonly events: RecordingEventsService,
  ) {}

  get tempDir(): string {
    return join(this.config.uploadsDir, 'tmp');
  }

  async upload(caller: Caller, visitId: string, request: Request): Promise<RecordingDto> {
    const visit = await this.dataSource.getRepository(Visit).findOne({
      where: scopedWhere<Visit>(caller.ability, 'upload', 'Recording', { id: visitId }),
    });
    if (visit === null) {
      throw new GyreException(
        ErrorKind.NotFound,
        RecordingsError.VisitNotFound,
        `No visit ${visitId}.`,
        {
          visitId,
        },
      );
    }
    const received = await this.receive(request);
    const tempPath = received.recording.tempPath;
    try {
      const kind = kindOf(received.fields.kind);
      if (received.onsetsCsv !== null && kind !== 'task') {
        throw formError(
          'onsets',
          'an onset CSV with a resting recording',
          'onsets only beside a task recording',
        );
      }
      const row = await this.insertReceived(caller, visit, kind, received);
      this.emit(row, null);
      const outcome = await this.pool
        .validate({
          filePath: tempPath,
          kind,
          onsetsCsv: received.onsetsCsv === null ? null : received.onsetsCsv.toString('utf8'),
        })
        .catch((error: unknown) => ({
          ok: false as const,
          message: `The file could not be checked: ${error instanceof Error ? error.message : String(error)}`,
          field: null,
          found: null,
          expected: null,
        }));
      if (!outcome.ok) {
        const { ok: _ok, ...rejection } = outcome;
        const rejected = await this.reject(caller, row, rejection);
        throw new GyreException(
          ErrorKind.Unprocessable,
          RecordingsError.Rejected,
          rejection.message,
          {
            ...rejection,
            recording: rejected,
          },
        );
      }
      return await this.accept(caller, row, tempPath, outcome.facts, received.onsetsCsv);
    } finally {
      await unlink(tempPath).catch(() => undefined);
    }
  }

  async list(caller: Caller, query: RecordingListQueryDto): Promise<Page<RecordingDto>> {
    const window = pageWindowOf(query, 'desc');
    const filters: Partial<
      Record<'visitId' | 'participantId' | 'siteId' | 'state' | 'kind', string>
    > = {};
    for (const key of ['visitId', 'participantId', 'siteId', 'state', 'kind'] as const) {
      const value = query[key];
      if (value !== undefined) filters[key] = value;
    }
    const [rows, total] = await this.dataSource.getRepository(Recording).findAndCount({
      where: scopedWhere<Recording>(
        caller.ability,
        'read',
        'Recording',
        filters as FindOptionsWhere<Recording>,
      ),
      order: { [query.sort ?? 'createdAt']: window.order, id: window.order },
      skip: window.skip,
      take: window.take,
    });
    const views = await this.views(rows);
    return toPage([views, total], window, (v) => v);
  }

  async get(caller: Caller, id: string): Promise<RecordingDto> {
    const [view] = await this.views([await this.findInScope(caller, id, 'read')]);
    return view;
  }

  /** The recording's current state first, then every change until a final state. */
  async events$(caller: Caller, id: string): Promise<Observable<RecordingEvent>> {
    const current = await this.get(caller, id);
    const first: RecordingEvent = {
      recordingId: id,
      state: current.state,
      progressPercent: current.progressPercent,
      error: current.failureMessage,
    };
    if (TERMINAL.includes(current.state)) return of(first);
    return concat(
      from([first]),
      this.events.of(id).pipe(takeWhile((event) => !TERMINAL.includes(event.state), true)),
    );
  }

  /** A failed recording computed again with the current settings (technician or analyst). */
  async retry(caller: Caller, id: string): Promise<RecordingDto> {
    const row = await this.findInScope(caller, id, 'retry');
    if (row.state !== 'failed') {
      throw new GyreException(
        ErrorKind.Conflict,
        RecordingsError.NotRetryable,
        `Only a failed recording can be retried; this one is ${row.state}.`,
        { state: row.state },
      );
    }
    await this.jobs.requeue(caller, [row], 'retry', null);
    return this.get(caller, id);
  }

  /** 404 when the recording does not exist or lies outside the caller's scope for `action`. */
  async findInScope(
    caller: Caller,
    id: string,
    action: 'read' | 'retry' | 'update',
  ): Promise<Recording> {
    const row = await this.dataSource.getRepository(Recording).findOne({
      where: scopedWhere<Recording>(caller.ability, action, 'Recording', { id }),
    });
    if (row === null) {
      throw new GyreException(ErrorKind.NotFound, RecordingsError.NotFound, `No recording ${id}.`, {
        recordingId: id,
      });
    }
    return row;
  }

  async views(rows: Recording[]): Promise<RecordingDto[]> {
    if (rows.length === 0) return [];
    const ids = rows.map((r) => r.id);
    const jobs = await this.dataSource
      .getRepository(Job)
      .find({ where: { recordingId: In(ids) }, order: { createdAt: 'DESC', id: 'DESC' } });
    const settingsIds = [...new Set(jobs.map((j) => j.settingsId))];
    const versions = new Map(
      (settingsIds.length === 0
        ? []
        : await this.dataSource.getRepository(AnalysisSettings).find({
            where: { id: In(settingsIds) },
            select: { id: true, version: true },
          })
      ).map((s) => [s.id, s.version]),
    );
    const runs = await this.dataSource.getRepository(AnalysisRun).find({
      where: { recordingId: In(ids) },
      select: { id: true, recordingId: true, createdAt: true },
      order: { createdAt: 'DESC', id: 'DESC' },
    });
    const latestJob = new Map<string, Job>();
    for (const job of jobs)
      if (!latestJob.has(job.recordingId)) latestJob.set(job.recordingId, job);
    const latestRun = new Map<string, string>();
    for (const run of runs)
      if (!latestRun.has(run.recordingId)) latestRun.set(run.recordingId, run.id);
    return rows.map((row) => {
      const job = latestJob.get(row.id);
      return toRecordingDto(
        row,
        job === undefined ? null : toJobDto(job, versions.get(job.settingsId) ?? 0),
        latestRun.get(row.id) ?? null,
      );
    });
  }

  /** Uploads cut short by a restart: their temporary files are gone with the request. */
  async recoverInterruptedUploads(): Promise<void> {
    await rm(this.tempDir, { recursive: true, force: true });
    const stale = await this.dataSource
      .getRepository(Recording)
      .find({ where: { state: 'received' } });
    for (const row of stale) {
      await this.writes.run(async (manager) => {
        await this.setRejected(manager, row, {
          message:
            'The upload was interrupted by a server restart before the file was checked; upload it again.',
          field: null,
          found: null,
          expected: null,
        });
        await this.audit.record({
          actor: null,
          action: 'reject',
          objectType: 'Recording',
          objectId: row.id,
          studyId: row.studyId,
          siteId: row.siteId,
          before: { state: 'received' },
          after: { state: 'rejected', checksumSha256: row.checksumSha256 },
          reason: 'upload interrupted by a restart',
        });
      });
    }
    if (stale.length > 0) this.logger.warn(`${stale.length} interrupted upload(s) marked rejected`);
  }

  private async receive(
    request: Request,
  ): Promise<ReceivedUpload & { recording: NonNullable<ReceivedUpload['recording']> }> {
    try {
      const received = await receiveUpload(request, {
        tempDir: this.tempDir,
        maxRecordingBytes: this.config.uploadMaxBytes,
        maxOnsetsCsvBytes: MAX_ONSETS_CSV_BYTES,
        recordingField: 'file',
        onsetsField: 'onsets',
        allowedFields: ['kind'],
      });
      if (received.recording === null) throw formError('file', 'none', 'an EDF/EDF+ file part');
      return { ...received, recording: received.recording };
    } catch (error) {
      if (error instanceof UploadTooLargeError) {
        // Stop reading: the rest of an oversize body is not worth receiving.
        request.unpipe();
        request.resume();
        throw new GyreException(
          ErrorKind.PayloadTooLarge,
          RecordingsError.TooLarge,
          error.message,
          {
            field: error.part,
            limitBytes: error.limitBytes,
          },
        );
      }
      if (error instanceof UploadFormError)
        throw formError(error.field, error.found, error.expected);
      throw error;
    }
  }

  private async insertReceived(
    caller: Caller,
    visit: Visit,
    kind: RecordingKind,
    received: ReceivedUpload & { recording: NonNullable<ReceivedUpload['recording']> },
  ): Promise<Recording> {
    const now = nowIso();
    const row = Object.assign(new Recording(), {
      id: randomUUID(),
      studyId: visit.studyId,
      siteId: visit.siteId,
      participantId: visit.participantId,
      visitId: visit.id,
      kind,
      state: 'received' as const,
      checksumSha256: received.recording.sha256,
      sizeBytes: received.recording.sizeBytes,
      storedFile: null,
      factsJson: null,
      csvOnsetsJson: null,
      onsetsChecksumSha256:
        received.onsetsCsv === null
          ? null
          : createHash('sha256').update(received.onsetsCsv).digest('hex'),
      rejectionJson: null,
      failureMessage: null,
      uploadedById: caller.user.id,
      createdAt: now,
      updatedAt: now,
    });
    return this.writes.run(async (manager) => {
      const duplicate = await manager.getRepository(Recording).findOne({
        where: { visitId: visit.id, checksumSha256: row.checksumSha256, state: Not('rejected') },
      });
      if (duplicate !== null) {
        throw new GyreException(
          ErrorKind.Conflict,
          RecordingsError.Duplicate,
          `This file (SHA-256 ${row.checksumSha256}) is already recording ${duplicate.id} of this visit.`,
          { recordingId: duplicate.id, checksumSha256: row.checksumSha256 },
        );
      }
      await manager.getRepository(Recording).insert(row);
      return row;
    });
  }

  private async reject(
    caller: Caller,
    row: Recording,
    rejection: RecordingRejection,
  ): Promise<RecordingDto> {
    const rejected = await this.writes.run(async (manager) => {
      const updated = await this.setRejected(manager, row, rejection);
      await this.audit.record({
        actor: caller.user,
        action: 'reject',
        objectType: 'Recording',
        objectId: row.id,
        studyId: row.studyId,
        siteId: row.siteId,
        before: null,
        after: {
          state: 'rejected',
          kind: row.kind,
          visitId: row.visitId,
          checksumSha256: row.checksumSha256,
          sizeBytes: row.sizeBytes,
          rejection,
        },
        reason: rejection.message,
        clientIp: caller.clientIp,
      });
      return updated;
    });
    this.emit(rejected, rejection.message);
    const [view] = await this.views([rejected]);
    return view;
  }

  private async setRejected(
    manager: EntityManager,
    row: Recording,
    rejection: RecordingRejection,
  ): Promise<Recording> {
    const changes = {
      state: 'rejected' as const,
      rejectionJson: JSON.stringify(rejection),
      updatedAt: nowIso(),
    };
    await manager.getRepository(Recording).update({ id: row.id }, changes);
    return Object.assign(row, changes);
  }

  private async accept(
    caller: Caller,
    row: Recording,
    tempPath: string,
    facts: RecordingFacts,
    onsetsCsv: Buffer | null,
  ): Promise<RecordingDto> {
    const storedFile = `${row.checksumSha256}.edf`;
    const target = join(this.config.uploadsDir, storedFile);
    await mkdir(this.config.uploadsDir, { recursive: true });
    // Named by content: the same file in another visit is already there, byte for byte.
    const exists = await stat(target).then(
      () => true,
      () => false,
    );
    if (!exists) await rename(tempPath, target);
    const { csvOnsets, ...rest } = facts;
    const queued = await this.writes.run(async (manager) => {
      const changes = {
        storedFile,
        factsJson: JSON.stringify(rest),
        csvOnsetsJson: csvOnsets === null ? null : JSON.stringify(csvOnsets),
        updatedAt: nowIso(),
      };
      await manager.getRepository(Recording).update({ id: row.id }, changes);
      Object.assign(row, changes);
      await this.jobs.enqueue(manager, row, caller.user.id);
      await this.audit.record({
        actor: caller.user,
        action: 'upload',
        objectType: 'Recording',
        objectId: row.id,
        studyId: row.studyId,
        siteId: row.siteId,
        before: null,
        after: {
          state: 'queued',
          kind: row.kind,
          visitId: row.visitId,
          checksumSha256: row.checksumSha256,
          sizeBytes: row.sizeBytes,
          onsetsChecksumSha256: row.onsetsChecksumSha256,
          csvOnsetCount: csvOnsets?.length ?? null,
          durationS: facts.durationS,
          channels: facts.channelLabels.length,
        },
        reason: null,
        clientIp: caller.clientIp,
      });
      return row;
    });
    void onsetsCsv;
    this.jobs.pump();
    const [view] = await this.views([queued]);
    return view;
  }

  private emit(row: Recording, error: string | null): void {
    this.events.emit({ recordingId: row.id, state: row.state, progressPercent: null, error });
  }
}

function kindOf(value: string | undefined): RecordingKind {
  if (value === undefined || !(RECORDING_KINDS as readonly string[]).includes(value)) {
    throw formError(
      'kind',
      value === undefined ? 'none' : `'${value}'`,
      `one of ${RECORDING_KINDS.join(', ')}`,
    );
  }
  return value as RecordingKind;
}

function formError(field: string, found: string, expected: string): GyreException {
  return new GyreException(
    ErrorKind.BadInput,
    RecordingsError.FormInvalid,
    `${field}: ${found} found, ${expected} expected`,
    { field, found, expected },
  );
}
