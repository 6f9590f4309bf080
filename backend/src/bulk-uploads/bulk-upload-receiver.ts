import { randomUUID } from 'node:crypto';
import { mkdir, unlink } from 'node:fs/promises';
import { basename, join } from 'node:path';
import { Readable } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import busboy from 'busboy';
import type { Request } from 'express';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import {
  removeTempFiles,
  sharedByteMeter,
  type MultiFileReceiver,
} from '../common/http/multi-file-import';
import { writeBlankedFile } from '../recordings/upload/blanked-file-writer';
import { drainRequest, parseBody, type ReceivedFile } from '../recordings/upload/multipart-upload';
import { BulkUploadsError, bulkUploadsError } from './bulk-uploads.errors';
import { errorMessage } from '../common/errors/error-message';

const MAX_MANIFEST_BYTES = 1024 * 1024;
const MAX_ONSETS_CSV_BYTES = 4 * 1024 * 1024;
const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

/** What a bulk upload's body held, on disk and in memory. */
export interface ReceivedBulkUpload {
  manifest: Buffer;
  /** Recordings by file name, stored blanked in the temporary folder. */
  recordings: Map<string, ReceivedFile>;
  /** Onset CSVs (`*.csv` parts) by file name. */
  onsets: Map<string, Buffer>;
  /** File names sent more than once (each copy after the first is dropped). */
  repeatedNames: string[];
}

class TooLarge extends Error {
  constructor(
    readonly part: string,
    readonly limitBytes: number,
    readonly setting: string,
    message = `${part}: more than ${limitBytes} bytes sent, at most ${limitBytes} accepted (${setting})`,
  ) {
    super(message);
  }
}

class FormInvalid extends Error {}

/**
 * The HTTP edge of a bulk upload: one `manifest` part (the CSV) and many `files` parts.
 * A `files` part whose name ends in `.csv` is an onset CSV, kept in memory; every other one is
 * a recording, streamed through the recordings module's identifying-fields blanker and a
 * SHA-256 into `uploads/tmp/` (the folder the recordings module empties at start), like a
 * single upload. Limits: UPLOAD_MAX_BYTES per recording, BULK_UPLOAD_MAX_BYTES for all parts
 * together (413 naming the limit). On any failure every temporary file is removed.
 */
@Injectable()
export class BulkUploadReceiver implements MultiFileReceiver<ReceivedBulkUpload> {
  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  async receive(request: Request): Promise<ReceivedBulkUpload> {
    try {
      return await this.parse(request);
    } catch (error) {
      drainRequest(request);
      if (error instanceof TooLarge) {
        throw bulkUploadsError(BulkUploadsError.TooLarge, error.message, {
          part: error.part,
          limitBytes: error.limitBytes,
          setting: error.setting,
        });
      }
      if (error instanceof FormInvalid) {
        throw bulkUploadsError(BulkUploadsError.FormInvalid, error.message);
      }
      throw error;
    }
  }

  /** Removes every temporary file of a received upload. */
  discard(received: ReceivedBulkUpload): Promise<void> {
    return removeTempFiles(received.recordings.values());
  }

  private async parse(request: Request): Promise<ReceivedBulkUpload> {
    const contentType = request.headers['content-type'] ?? '';
    if (!/^multipart\/form-data/i.test(contentType)) {
      throw new FormInvalid(
        `Content-Type: '${contentType || 'none'}' found, 'multipart/form-data' with a 'manifest' part and 'files' parts expected`,
      );
    }
    const totalLimit = this.config.bulkUploadMaxBytes;
    const declared = Number(request.headers['content-length']);
    if (Number.isFinite(declared) && declared > totalLimit + MULTIPART_OVERHEAD_BYTES) {
      throw new TooLarge('files', totalLimit, 'BULK_UPLOAD_MAX_BYTES');
    }
    const tempDir = join(this.config.uploadsDir, 'tmp');
    await mkdir(tempDir, { recursive: true });
    let parser: ReturnType<typeof busboy>;
    try {
      parser = busboy({
        headers: request.headers,
        limits: {
          fileSize:
            Math.max(this.config.uploadMaxBytes, MAX_ONSETS_CSV_BYTES, MAX_MANIFEST_BYTES) + 1,
          // A recording and an onset CSV per row, and the manifest.
          files: this.config.bulkUploadMaxRows * 2 + 1,
          fields: 0,
        },
      });
    } catch (error) {
      throw new FormInvalid(
        `Content-Type: '${contentType.slice(0, 200)}' found (${errorMessage(error)}), 'multipart/form-data; boundary=…' expected`,
      );
    }
    const received: ReceivedBulkUpload = {
      manifest: Buffer.alloc(0),
      recordings: new Map(),
      onsets: new Map(),
      repeatedNames: [],
    };
    let manifest: Buffer | null = null;
    let failure: Error | null = null;
    const fail = (error: Error): void => {
      failure ??= error;
    };
    // A part that broke off (too large, disk error) stops the whole body: nothing more is kept.
    const stop = (error: Error): void => {
      fail(error);
      if (!parser.destroyed) parser.destroy(error);
    };
    const tempPaths: string[] = [];
    const writes: Promise<void>[] = [];
    // Counts every byte of every part against BULK_UPLOAD_MAX_BYTES.
    const totalMeter = sharedByteMeter(
      totalLimit,
      () => new TooLarge('files', totalLimit, 'BULK_UPLOAD_MAX_BYTES'),
    );

    parser.on('field', (name: string) =>
      fail(
        new FormInvalid(`form field '${name}': an unknown field found, only file parts expected`),
      ),
    );
    parser.on(
      'file',
      (part: string, stream: Readable & { truncated?: boolean }, info: { filename?: string }) => {
        const name = basename((info.filename ?? '').replace(/\\/g, '/'));
        if (failure !== null) {
          stream.resume();
          return;
        }
        if (part === 'manifest' && manifest === null) {
          writes.push(
            collect(
              stream.pipe(totalMeter()),
              'manifest',
              MAX_MANIFEST_BYTES,
              'a manifest of at most 1 MiB',
            ).then((bytes) => {
              manifest = bytes;
            }, fail),
          );
          return;
        }
        if (part !== 'files' || name === '' || hasControlCharacter(name)) {
          stream.resume();
          fail(
            new FormInvalid(
              part === 'files'
                ? `file part 'files': the file name '${name}' found, a plain file name without control characters expected`
                : `file part '${part}': an unexpected or repeated part found, one 'manifest' and 'files' parts expected`,
            ),
          );
          return;
        }
        if (received.recordings.has(name) || received.onsets.has(name)) {
          received.repeatedNames.push(name);
          stream.resume();
          return;
        }
        if (/\.csv$/i.test(name)) {
          writes.push(
            collect(
              stream.pipe(totalMeter()),
              name,
              MAX_ONSETS_CSV_BYTES,
              'an onset CSV of at most 4 MiB',
            ).then((bytes) => {
              received.onsets.set(name, bytes);
            }, fail),
          );
          return;
        }
        const path = join(tempDir, `${randomUUID()}.part`);
        tempPaths.push(path);
        writes.push(
          writeBlankedFile(stream, path, {
            maxBytes: this.config.uploadMaxBytes,
            tooLarge: () => new TooLarge(name, this.config.uploadMaxBytes, 'UPLOAD_MAX_BYTES'),
            meter: totalMeter(),
          }).then((file) => {
            // The name the file had, shown in Intake (recordings keep it, row-scoped).
            received.recordings.set(name, { tempPath: path, ...file, originalName: name });
          }, stop),
        );
      },
    );
    parser.on('filesLimit', () => {
      const most = this.config.bulkUploadMaxRows * 2 + 1;
      fail(
        new TooLarge(
          'files',
          most,
          'BULK_UPLOAD_MAX_ROWS',
          `files: more than ${most} files sent, at most ${most} accepted (a recording and an onset CSV per row of BULK_UPLOAD_MAX_ROWS, and the manifest)`,
        ),
      );
    });
    parser.on('fieldsLimit', () =>
      fail(new FormInvalid('fields: a form field found, only file parts expected')),
    );

    const parserError = await parseBody(request, parser);
    await Promise.all(writes);
    const problem =
      failure ??
      (parserError === null
        ? null
        : new FormInvalid(
            `multipart body: '${parserError.message}' found, a complete multipart/form-data body (RFC 7578) expected`,
          )) ??
      (manifest === null
        ? new FormInvalid("file part 'manifest': none found, the manifest CSV expected")
        : null);
    if (problem !== null) {
      for (const path of tempPaths) await unlink(path).catch(() => undefined);
      throw problem;
    }
    received.manifest = manifest ?? Buffer.alloc(0);
    return received;
  }
}

async function collect(
  stream: Readable,
  part: string,
  maxBytes: number,
  expected: string,
): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let total = 0;
  for await (const chunk of stream) {
    total += (chunk as Buffer).byteLength;
    if (total <= maxBytes) chunks.push(chunk as Buffer);
  }
  if (total > maxBytes)
    throw new FormInvalid(`${part}: ${total} bytes found, ${expected} expected`);
  return Buffer.concat(chunks);
}

/** C0 controls and DEL (RFC 5987 `filename*` can smuggle CR/LF past the header syntax). */
function hasControlCharacter(text: string): boolean {
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x20 || code === 0x7f) return true;
  }
  return false;
}
