import { unlink } from 'node:fs/promises';
import { join } from 'node:path';
import { Inject, Injectable } from '@nestjs/common';
import type { Request } from 'express';
import type { RecordingKind } from '@gyre/shared';
import { RECORDING_KINDS } from '@gyre/shared';
import { GyreException } from '../../common/errors/gyre.exception';
import type { AppConfig } from '../../config/app.config';
import { APP_CONFIG } from '../../config/config.module';
import { RecordingsError, recordingsError } from '../recordings.errors';
import {
  drainRequest,
  ReceivedFile,
  receiveUpload,
  UploadFormError,
  UploadTooLargeError,
} from './multipart-upload';

const MAX_ONSETS_CSV_BYTES = 4 * 1024 * 1024;
const MAX_REASON_LENGTH = 2000;
const MIN_REASON_LENGTH = 10;

/** An upload as the service receives it: stored (blanked) on disk, fields checked and typed. */
export interface StoredUpload {
  file: ReceivedFile;
  onsetsCsv: Buffer | null;
  kind: RecordingKind;
  /** The technician confirmed the kind against what the file holds. */
  confirmKind: boolean;
  /** The visit's current recording of this kind that the upload replaces, and why. */
  replaces: { recordingId: string; reason: string } | null;
}

/**
 * The HTTP edge of uploads: streams the multipart body to a temporary file (see
 * `multipart-upload.ts`) and turns its fields into a `StoredUpload`, or a 400/413 naming the
 * field. The caller deletes `file.tempPath` when done with it.
 */
@Injectable()
export class UploadReceiver {
  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  get tempDir(): string {
    return join(this.config.uploadsDir, 'tmp');
  }

  async receive(request: Request): Promise<StoredUpload> {
    let received;
    try {
      received = await receiveUpload(request, {
        tempDir: this.tempDir,
        maxRecordingBytes: this.config.uploadMaxBytes,
        maxOnsetsCsvBytes: MAX_ONSETS_CSV_BYTES,
        recordingField: 'file',
        onsetsField: 'onsets',
        allowedFields: ['kind', 'confirmKind', 'replaces', 'replacementReason'],
      });
    } catch (error) {
      drainRequest(request);
      if (error instanceof UploadTooLargeError) {
        throw recordingsError(RecordingsError.TooLarge, error.message, {
          field: error.part,
          limitBytes: error.limitBytes,
        });
      }
      if (error instanceof UploadFormError)
        throw formError(error.field, error.found, error.expected);
      throw error;
    }
    const file = received.recording;
    if (file === null) throw formError('file', 'none', 'an EDF/EDF+ file part');
    try {
      return {
        file,
        onsetsCsv: received.onsetsCsv,
        kind: kindOf(received.fields.kind),
        confirmKind: flagOf('confirmKind', received.fields.confirmKind),
        replaces: replacementOf(received.fields.replaces, received.fields.replacementReason),
      };
    } catch (error) {
      await unlink(file.tempPath).catch(() => undefined);
      throw error;
    }
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

function flagOf(field: string, value: string | undefined): boolean {
  if (value === undefined || value === 'false') return false;
  if (value === 'true') return true;
  throw formError(field, `'${value}'`, "'true' or 'false'");
}

function replacementOf(
  recordingId: string | undefined,
  reason: string | undefined,
): StoredUpload['replaces'] {
  if (recordingId === undefined && reason === undefined) return null;
  if (recordingId === undefined || !/^[0-9a-f-]{36}$/i.test(recordingId)) {
    throw formError(
      'replaces',
      recordingId === undefined ? 'none' : `'${recordingId}'`,
      'the id of the recording this upload replaces',
    );
  }
  const trimmed = reason?.trim() ?? '';
  if (trimmed.length < MIN_REASON_LENGTH || trimmed.length > MAX_REASON_LENGTH) {
    throw formError(
      'replacementReason',
      `${trimmed.length} characters`,
      `a reason of ${MIN_REASON_LENGTH} to ${MAX_REASON_LENGTH} characters`,
    );
  }
  return { recordingId, reason: trimmed };
}

export function formError(field: string, found: string, expected: string): GyreException {
  return recordingsError(
    RecordingsError.FormInvalid,
    `${field}: ${found} found, ${expected} expected`,
    { field, found, expected },
  );
}
