import { createHash, randomUUID } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { mkdir, unlink } from 'node:fs/promises';
import type { IncomingMessage } from 'node:http';
import { join } from 'node:path';
import { PassThrough, Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import busboy from 'busboy';
import { PatientFieldBlanker } from './patient-field-blanker';

/** The recording as it landed in the temporary folder, patient field already blanked. */
export interface ReceivedFile {
  tempPath: string;
  /** SHA-256 (hex) of the bytes written, i.e. of the blanked copy. */
  sha256: string;
  sizeBytes: number;
}

export interface ReceivedUpload {
  fields: Record<string, string>;
  recording: ReceivedFile | null;
  /** The optional onset CSV, small enough to keep in memory. */
  onsetsCsv: Buffer | null;
}

export interface ReceiveUploadOptions {
  tempDir: string;
  /** Largest recording accepted; beyond it the upload fails with `UploadTooLargeError`. */
  maxRecordingBytes: number;
  maxOnsetsCsvBytes: number;
  recordingField: string;
  onsetsField: string;
  /** Text fields the form may carry; any other field is refused. */
  allowedFields: readonly string[];
}

/** The upload is larger than allowed (HTTP 413). */
export class UploadTooLargeError extends Error {
  constructor(
    readonly part: string,
    readonly limitBytes: number,
  ) {
    super(`${part}: more than ${limitBytes} bytes sent, at most ${limitBytes} bytes accepted`);
    this.name = 'UploadTooLargeError';
  }
}

/** The request is not the multipart form expected (HTTP 400). */
export class UploadFormError extends Error {
  constructor(
    readonly field: string,
    readonly found: string,
    readonly expected: string,
  ) {
    super(`${field}: ${found} found, ${expected} expected`);
    this.name = 'UploadFormError';
  }
}

const MULTIPART_OVERHEAD_BYTES = 64 * 1024;

/**
 * Streams a multipart/form-data request to disk with busboy: the recording goes
 * through the patient-field blanker, then the SHA-256 hash and a byte counter, into a
 * temporary file, so it never sits whole in memory and the original patient field
 * never reaches the disk. On any failure the temporary file is removed before the
 * error is thrown.
 */
export async function receiveUpload(
  request: IncomingMessage,
  options: ReceiveUploadOptions,
): Promise<ReceivedUpload> {
  const contentType = request.headers['content-type'] ?? '';
  if (!/^multipart\/form-data/i.test(contentType)) {
    throw new UploadFormError(
      'Content-Type',
      `'${contentType || 'none'}'`,
      "'multipart/form-data' with a 'file' part",
    );
  }
  const declared = Number(request.headers['content-length']);
  const ceiling = options.maxRecordingBytes + options.maxOnsetsCsvBytes + MULTIPART_OVERHEAD_BYTES;
  if (Number.isFinite(declared) && declared > ceiling) {
    throw new UploadTooLargeError(options.recordingField, options.maxRecordingBytes);
  }
  await mkdir(options.tempDir, { recursive: true });

  const fields: Record<string, string> = {};
  const writes: Promise<void>[] = [];
  let recording: ReceivedFile | null = null;
  let tempPath: string | null = null;
  let onsetsCsv: Buffer | null = null;
  let failure: Error | null = null;
  const fail = (error: Error): void => {
    failure ??= error;
  };

  const parser = busboy({
    headers: request.headers,
    limits: {
      fileSize: options.maxRecordingBytes,
      files: 2,
      fields: options.allowedFields.length,
      // Room for a replacement reason (at most 2000 characters, up to 4 bytes each in UTF-8).
      fieldSize: 8192,
      parts: options.allowedFields.length + 2,
    },
  });

  parser.on('field', (name, value, info: { valueTruncated: boolean }) => {
    if (info.valueTruncated) {
      fail(new UploadFormError(`form field '${name}'`, 'more than 8192 bytes', 'a shorter value'));
      return;
    }
    if (!options.allowedFields.includes(name)) {
      fail(
        new UploadFormError(
          `form field '${name}'`,
          'an unknown field',
          options.allowedFields.join(', '),
        ),
      );
      return;
    }
    fields[name] = value;
  });
  parser.on('file', (name, stream) => {
    if (name === options.recordingField && tempPath === null) {
      const path = join(options.tempDir, `${randomUUID()}.part`);
      tempPath = path;
      writes.push(
        writeRecording(stream, path, options).then(
          (file) => {
            recording = file;
          },
          (error: Error) => fail(error),
        ),
      );
    } else if (name === options.onsetsField && onsetsCsv === null) {
      writes.push(
        collectSmallFile(stream, options.onsetsField, options.maxOnsetsCsvBytes).then(
          (bytes) => {
            onsetsCsv = bytes;
          },
          (error: Error) => fail(error),
        ),
      );
    } else {
      stream.resume();
      fail(
        new UploadFormError(
          `file part '${name}'`,
          'an unexpected or repeated file',
          `one '${options.recordingField}' and at most one '${options.onsetsField}'`,
        ),
      );
    }
  });
  parser.on('filesLimit', () =>
    fail(
      new UploadFormError('files', 'more than 2 files', 'a recording and an optional onset CSV'),
    ),
  );
  parser.on('fieldsLimit', () =>
    fail(new UploadFormError('fields', 'too many form fields', options.allowedFields.join(', '))),
  );

  try {
    await pipeline(request, parser);
  } catch (error) {
    fail(error instanceof Error ? error : new Error(String(error)));
  }
  await Promise.all(writes);
  if (failure !== null || recording === null) {
    if (tempPath !== null) await unlink(tempPath).catch(() => undefined);
    throw (
      failure ??
      new UploadFormError(`file part '${options.recordingField}'`, 'none', 'an EDF/EDF+ file')
    );
  }
  return { fields, recording, onsetsCsv };
}

async function writeRecording(
  stream: Readable & { truncated?: boolean },
  path: string,
  options: ReceiveUploadOptions,
): Promise<ReceivedFile> {
  const hash = createHash('sha256');
  let sizeBytes = 0;
  const meter = new PassThrough();
  meter.on('data', (chunk: Buffer) => {
    hash.update(chunk);
    sizeBytes += chunk.byteLength;
  });
  let truncated = false;
  stream.on('limit', () => {
    truncated = true;
  });
  await pipeline(
    stream,
    new PatientFieldBlanker(),
    meter,
    createWriteStream(path, { flags: 'wx', mode: 0o600 }),
  );
  if (truncated || stream.truncated) {
    await unlink(path).catch(() => undefined);
    throw new UploadTooLargeError(options.recordingField, options.maxRecordingBytes);
  }
  return { tempPath: path, sha256: hash.digest('hex'), sizeBytes };
}

async function collectSmallFile(stream: Readable, part: string, maxBytes: number): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let total = 0;
  let tooLarge = false;
  for await (const chunk of stream) {
    const bytes = chunk as Buffer;
    total += bytes.byteLength;
    if (total > maxBytes) tooLarge = true;
    else chunks.push(bytes);
  }
  if (tooLarge) throw new UploadTooLargeError(part, maxBytes);
  return Buffer.concat(chunks);
}
