import { randomUUID } from 'node:crypto';
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { PassThrough, Readable } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import busboy from 'busboy';
import type { Request } from 'express';
import { Unzip, UnzipInflate } from 'fflate';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import {
  removeTempFiles,
  sharedByteMeter,
  type MultiFileReceiver,
} from '../common/http/multi-file-import';
import { writeBlankedFile } from '../recordings/upload/blanked-file-writer';
import { drainRequest, parseBody, type ReceivedFile } from '../recordings/upload/multipart-upload';
import { BidsImportError, bidsImportError } from './bids-import.errors';
import { safeRelativePath } from './bids-paths';
import { errorMessage } from '../common/errors/error-message';

/** A sidecar (TSV, JSON) is small: kept in memory up to this size. */
const MAX_SIDECAR_BYTES = 4 * 1024 * 1024;
const TEXT_FIELDS = ['createParticipants', 'siteId', 'visitDate'] as const;
type TextField = (typeof TEXT_FIELDS)[number];

/** A recording of the upload: `*_eeg.edf` or `*_eeg.bdf` (EEG-BIDS raw data formats). */
export const RECORDING_PATH = /_eeg\.(edf|bdf)$/i;
const SIDECAR_PATH = /\.(tsv|json)$/i;

/** What an import's body held: recordings on disk (blanked), sidecars in memory, by path. */
export interface ReceivedBidsUpload {
  recordings: Map<string, ReceivedFile>;
  sidecars: Map<string, Buffer>;
  /** Paths of other files (README, other datatypes): listed, never kept. */
  ignored: string[];
  /** Paths sent more than once (the copies after the first are dropped). */
  repeated: string[];
  fields: Partial<Record<TextField, string>>;
}

class Refusal extends Error {
  constructor(
    readonly code: BidsImportError,
    message: string,
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

/**
 * The HTTP edge of an EEG-BIDS import: `files` parts whose file names carry their path in the
 * dropped folder (busboy `preservePath`), or one `archive` part, a zip read as it streams in
 * (fflate). Every path is checked before anything of it is written (`safeRelativePath`).
 * Recordings go through the recordings module's identifying-fields blanker and a SHA-256 into
 * `uploads/tmp/`, like any upload; sidecars stay in memory. BULK_UPLOAD_MAX_BYTES bounds the
 * body and the unzipped bytes, UPLOAD_MAX_BYTES each recording. On failure nothing is left.
 */
@Injectable()
export class BidsImportReceiver implements MultiFileReceiver<ReceivedBidsUpload> {
  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  async receive(request: Request): Promise<ReceivedBidsUpload> {
    const received: ReceivedBidsUpload = {
      recordings: new Map(),
      sidecars: new Map(),
      ignored: [],
      repeated: [],
      fields: {},
    };
    try {
      await this.parse(request, received);
      if (received.recordings.size + received.sidecars.size + received.ignored.length === 0) {
        throw new Refusal(
          BidsImportError.FormInvalid,
          "files: none found; a BIDS folder's files ('files' parts) or one zip ('archive') expected",
        );
      }
      return received;
    } catch (error) {
      drainRequest(request);
      await this.discard(received);
      if (error instanceof Refusal) throw bidsImportError(error.code, error.message, error.details);
      throw error;
    }
  }

  /** Removes every temporary file of a received upload. */
  discard(received: ReceivedBidsUpload): Promise<void> {
    return removeTempFiles(received.recordings.values());
  }

  private async parse(request: Request, received: ReceivedBidsUpload): Promise<void> {
    const contentType = request.headers['content-type'] ?? '';
    if (!/^multipart\/form-data/i.test(contentType)) {
      throw new Refusal(
        BidsImportError.FormInvalid,
        `Content-Type: '${contentType || 'none'}' found, 'multipart/form-data' expected`,
      );
    }
    const limit = this.config.bulkUploadMaxBytes;
    const tempDir = join(this.config.uploadsDir, 'tmp');
    await mkdir(tempDir, { recursive: true });
    let parser: ReturnType<typeof busboy>;
    try {
      parser = busboy({ headers: request.headers, preservePath: true, limits: { fields: 3 } });
    } catch (error) {
      throw new Refusal(
        BidsImportError.FormInvalid,
        `Content-Type: '${contentType.slice(0, 200)}' found (${errorMessage(error)}), 'multipart/form-data; boundary=…' expected`,
      );
    }
    let failure: Error | null = null;
    const fail = (error: unknown): void => {
      failure ??= error instanceof Error ? error : new Error(String(error));
      if (!parser.destroyed) parser.destroy(failure);
    };
    const writes: Promise<void>[] = [];
    let unzippedBytes = 0;
    const meter = sharedByteMeter(limit, () => tooLarge('files', limit, 'BULK_UPLOAD_MAX_BYTES'));
    /** One file of the folder or zip, by its path. */
    const take = (rawPath: string, stream: Readable): void => {
      const safe = safeRelativePath(rawPath);
      if ('problem' in safe) {
        stream.resume();
        fail(new Refusal(BidsImportError.PathUnsafe, safe.problem, { path: rawPath }));
        return;
      }
      const path = safe.path;
      if (received.recordings.has(path) || received.sidecars.has(path)) {
        received.repeated.push(path);
        stream.resume();
        return;
      }
      if (RECORDING_PATH.test(path)) {
        const tempPath = join(tempDir, `${randomUUID()}.part`);
        const file: ReceivedFile = {
          tempPath,
          sha256: '',
          sizeBytes: 0,
          originalName: path.slice(path.lastIndexOf('/') + 1).slice(0, 255),
        };
        received.recordings.set(path, file);
        const maxBytes = this.config.uploadMaxBytes;
        writes.push(
          writeBlankedFile(stream, tempPath, {
            maxBytes,
            tooLarge: () => tooLarge(path, maxBytes, 'UPLOAD_MAX_BYTES'),
            stopAtLimit: true,
          }).then((written) => {
            Object.assign(file, written);
          }, fail),
        );
      } else if (SIDECAR_PATH.test(path)) {
        writes.push(
          collect(stream, path).then((bytes) => {
            received.sidecars.set(path, bytes);
          }, fail),
        );
      } else {
        received.ignored.push(path);
        stream.resume();
      }
    };

    parser.on('field', (name: string, value: string) => {
      if (!(TEXT_FIELDS as readonly string[]).includes(name)) {
        fail(
          new Refusal(
            BidsImportError.FormInvalid,
            `form field '${name}': unknown, one of ${TEXT_FIELDS.join(', ')} expected`,
            { field: name },
          ),
        );
        return;
      }
      received.fields[name as TextField] = value;
    });
    parser.on('fieldsLimit', () =>
      fail(new Refusal(BidsImportError.FormInvalid, 'fields: more than 3 form fields found')),
    );
    parser.on('file', (part: string, stream: Readable, info: { filename?: string }) => {
      if (failure !== null) {
        stream.resume();
        return;
      }
      // Destroying the parser (on any failure) errors its open file streams; whoever reads
      // the metered copy then sees the error instead of waiting for an end that never comes.
      const metered = meter();
      stream.on('error', (error) => {
        fail(error);
        metered.destroy(error);
      });
      metered.on('error', fail);
      stream.pipe(metered);
      if (part === 'files') take(info.filename ?? '', metered);
      else if (part === 'archive') {
        writes.push(
          readZip(metered, take, (bytes) => {
            unzippedBytes += bytes;
            if (unzippedBytes > limit) {
              throw tooLarge('archive (unzipped)', limit, 'BULK_UPLOAD_MAX_BYTES');
            }
          }).catch(fail),
        );
      } else {
        stream.resume();
        fail(
          new Refusal(
            BidsImportError.FormInvalid,
            `file part '${part}': unexpected, 'files' (a folder's files) or 'archive' (a zip) expected`,
            { field: part },
          ),
        );
      }
    });
    const parserError = await parseBody(request, parser);
    // A zip adds the writes of its entries while it is read: wait for those too.
    for (let i = 0; i < writes.length; i++) await writes[i];
    if (failure !== null) throw failure;
    if (parserError !== null) {
      throw new Refusal(
        BidsImportError.FormInvalid,
        `multipart body: '${parserError.message}' found, a complete multipart/form-data body (RFC 7578) expected`,
      );
    }
  }
}

function tooLarge(part: string, limitBytes: number, setting: string): Refusal {
  return new Refusal(
    BidsImportError.TooLarge,
    `${part}: more than ${limitBytes} bytes, at most ${limitBytes} accepted (${setting})`,
    { part, limitBytes, setting },
  );
}

async function collect(stream: Readable, path: string): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let total = 0;
  for await (const chunk of stream) {
    total += (chunk as Buffer).byteLength;
    if (total > MAX_SIDECAR_BYTES) {
      stream.resume();
      throw new Refusal(
        BidsImportError.FormInvalid,
        `${path}: more than ${MAX_SIDECAR_BYTES} bytes found, a sidecar (TSV, JSON) of at most 4 MiB expected`,
        { path },
      );
    }
    chunks.push(chunk as Buffer);
  }
  return Buffer.concat(chunks);
}

/**
 * Reads a zip as it streams in (fflate's `Unzip`: local file headers, stored or deflated
 * entries) and hands each file entry to `take` as a stream; directory entries are skipped.
 * `count` sees every unzipped byte (a bound against a "zip bomb"; common practice).
 */
async function readZip(
  source: Readable,
  take: (path: string, stream: Readable) => void,
  count: (bytes: number) => void,
): Promise<void> {
  const unzip = new Unzip();
  unzip.register(UnzipInflate);
  const entries: PassThrough[] = [];
  const failed: { error: Error | null } = { error: null };
  unzip.onfile = (entry) => {
    if (entry.name.endsWith('/')) return;
    // Thrown inside push(): a path leaving the folder stops the archive before it is written.
    const safe = safeRelativePath(entry.name);
    if ('problem' in safe) {
      throw new Refusal(BidsImportError.PathUnsafe, `archive: ${safe.problem}`, {
        path: entry.name,
      });
    }
    const out = new PassThrough();
    entries.push(out);
    entry.ondata = (error, chunk, final) => {
      try {
        if (error !== null) throw error;
        count(chunk.byteLength);
      } catch (problem) {
        failed.error ??= problem as Error;
        out.destroy(problem as Error);
        return;
      }
      out.write(chunk);
      if (final) out.end();
    };
    take(safe.path, out);
    entry.start();
  };
  try {
    for await (const chunk of source) unzip.push(chunk as Uint8Array);
    unzip.push(new Uint8Array(0), true);
    if (failed.error !== null) throw failed.error;
  } catch (error) {
    const refusal =
      error instanceof Refusal
        ? error
        : new Refusal(
            BidsImportError.ArchiveInvalid,
            `archive: ${errorMessage(error)}; a readable zip file expected`,
          );
    // Entries still being written end with the refusal, so nothing waits on them.
    for (const out of entries) if (!out.writableFinished) out.destroy(refusal);
    throw refusal;
  }
}
