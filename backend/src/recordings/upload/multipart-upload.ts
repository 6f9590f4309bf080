import { randomUUID } from 'node:crypto';
import { mkdir, unlink } from 'node:fs/promises';
import type { IncomingMessage } from 'node:http';
import { join } from 'node:path';
import { Readable, Writable } from 'node:stream';
import { finished } from 'node:stream/promises';
import busboy from 'busboy';
import { writeBlankedFile } from './blanked-file-writer';
import { errorMessage } from '../../common/errors/error-message';

/** The recording as it landed in the temporary folder, patient and recording fields blanked. */
export interface ReceivedFile {
  tempPath: string;
  /** SHA-256 (hex) of the bytes written, i.e. of the blanked copy. */
  sha256: string;
  sizeBytes: number;
  /**
   * The file name the client sent (its last path segment, at most 255 characters), or null
   * when it sent none. Shown to staff in scope; never read for anything else.
   */
  originalName?: string | null;
}

export interface ReceivedUpload {
  fields: Record<string, string>;
  recording: ReceivedFile | null;
  /** The optional onset CSV, small enough to keep in memory. */
  onsetsCsv: Buffer | null;
}

export interface ReceiveUploadOptions {
  tempDir: string;
  /** Largest recording accepted (inclusive); beyond it the upload fails with `UploadTooLargeError`. */
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
 * through the identifying-fields blanker, then the SHA-256 hash and a byte counter, into a
 * temporary file, so it never sits whole in memory and the original patient and recording
 * fields never reach the disk. A malformed body (RFC 7578) is an `UploadFormError`. On any
 * failure the temporary file is removed before the error is thrown.
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

  let parser: Writable;
  try {
    parser = busboy({
      headers: request.headers,
      limits: {
        // busboy cuts a file on reaching this: one past the largest part, so a limit is inclusive.
        fileSize: Math.max(options.maxRecordingBytes, options.maxOnsetsCsvBytes) + 1,
        files: 2,
        fields: options.allowedFields.length,
        // Room for a replacement reason (at most 2000 characters, up to 4 bytes each in UTF-8).
        fieldSize: 8192,
        parts: options.allowedFields.length + 2,
      },
    });
  } catch (error) {
    // busboy refuses a Content-Type without a boundary at once, before reading anything.
    throw new UploadFormError(
      'Content-Type',
      `'${contentType.slice(0, 200)}' (${errorMessage(error)})`,
      "'multipart/form-data; boundary=…' (RFC 7578 §4.1)",
    );
  }
  await mkdir(options.tempDir, { recursive: true });

  const fields: Record<string, string> = {};
  const writes: Promise<void>[] = [];
  let recording: ReceivedFile | null = null;
  let tempPath: string | null = null;
  let onsetsCsv: Buffer | null = null;
  let failure: Error | null = null;
  // Set when Gyre itself stops the parser (a disk error): not the client's fault.
  let stoppedBy: Error | null = null;
  const fail = (error: Error): void => {
    failure ??= error;
  };
  const failWrite = (error: Error): void => {
    fail(error);
    // A destroyed parser is where the error came from; a running one would stall for good.
    if (isClientError(error) || parser.destroyed) return;
    stoppedBy ??= error;
    parser.destroy(error);
  };

  parser.on('field', (name: string, value: string, info: { valueTruncated: boolean }) => {
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
  parser.on('file', (name: string, stream: Readable, info: { filename?: string }) => {
    if (hasControlCharacter(info.filename ?? '')) {
      stream.resume();
      fail(
        new UploadFormError(
          `file name of part '${name}'`,
          'a control character (such as CR or LF)',
          'a file name without control characters (RFC 7578 §4.2)',
        ),
      );
    } else if (name === options.recordingField && tempPath === null) {
      const path = join(options.tempDir, `${randomUUID()}.part`);
      tempPath = path;
      writes.push(
        writeBlankedFile(stream, path, {
          maxBytes: options.maxRecordingBytes,
          tooLarge: () =>
            new UploadTooLargeError(options.recordingField, options.maxRecordingBytes),
        }).then(
          (file) => {
            recording = { tempPath: path, ...file, originalName: plainFileName(info.filename) };
          },
          (error: Error) => failWrite(error),
        ),
      );
    } else if (name === options.onsetsField && onsetsCsv === null) {
      writes.push(
        collectSmallFile(stream, options.onsetsField, options.maxOnsetsCsvBytes).then(
          (bytes) => {
            onsetsCsv = bytes;
          },
          (error: Error) => failWrite(error),
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
  parser.on('partsLimit', () =>
    fail(
      new UploadFormError(
        'parts',
        `more than ${options.allowedFields.length + 2} parts`,
        `a '${options.recordingField}' part, an optional '${options.onsetsField}' part and the fields ${options.allowedFields.join(', ')}`,
      ),
    ),
  );

  const parserError = await parseBody(request, parser);
  await Promise.all(writes);
  const malformed =
    parserError !== null && parserError !== stoppedBy ? malformedBody(parserError) : null;
  // A broken body explains whatever the parts saw after it (they end with busboy's error).
  const problem = isClientError(failure) ? failure : (malformed ?? failure);
  if (problem !== null || recording === null) {
    if (tempPath !== null) await unlink(tempPath).catch(() => undefined);
    throw (
      problem ??
      new UploadFormError(
        `file part '${options.recordingField}'`,
        // busboy skips a part whose Content-Disposition it cannot read (say, split by CR LF).
        'none with a readable Content-Disposition header',
        'an EDF/EDF+ file (RFC 7578 §4.2)',
      )
    );
  }
  return { fields, recording, onsetsCsv };
}

/** The last segment of a client's file name (a browser may send a path), trimmed and capped. */
export function plainFileName(name: string | undefined): string | null {
  const last = (name ?? '').replace(/\\/g, '/').split('/').pop() ?? '';
  const trimmed = last.trim();
  return trimmed === '' ? null : trimmed.slice(0, MAX_FILE_NAME_LENGTH);
}

/** The longest file name kept (the column is varchar(255)). */
const MAX_FILE_NAME_LENGTH = 255;

/** C0 controls and DEL; RFC 5987 `filename*` can smuggle CR/LF past the header syntax. */
function hasControlCharacter(text: string): boolean {
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x20 || code === 0x7f) return true;
  }
  return false;
}

function isClientError(error: Error | null): boolean {
  return error instanceof UploadFormError || error instanceof UploadTooLargeError;
}

/**
 * After a refused body: stops feeding the parser and drains, not keeps, the rest, so a client
 * still sending gets the answer, not a reset.
 */
export function drainRequest(request: IncomingMessage): void {
  request.unpipe();
  request.resume();
}

/**
 * Feeds the request to the parser; resolves with the parser's error, or null once it has
 * read the whole form. Unlike `pipeline`, a parser failure does not destroy the request, so
 * the socket stays open for the 400 (the caller drains the rest of the body: `drainRequest`).
 */
export async function parseBody(request: IncomingMessage, parser: Writable): Promise<Error | null> {
  request.once('error', (error) => parser.destroy(error));
  request.once('close', () => {
    if (!request.complete) parser.destroy(new Error('the request ended before its body did'));
  });
  request.pipe(parser);
  try {
    await finished(parser);
    return null;
  } catch (error) {
    request.unpipe(parser);
    return error instanceof Error ? error : new Error(String(error));
  }
}

/** busboy's parse errors, as the field, what was found and what RFC 7578 expects. */
function malformedBody(error: Error): UploadFormError {
  const expected = 'a complete multipart/form-data body (RFC 7578)';
  switch (error.message) {
    case 'Unexpected end of form':
      return new UploadFormError(
        'multipart body',
        'a body that ends before its closing boundary',
        `${expected}, ending with '--' + boundary + '--' (RFC 7578 §4.1)`,
      );
    case 'Malformed part header':
      return new UploadFormError(
        'multipart body',
        'a malformed part header (e.g. a file name broken by CR or LF)',
        `${expected} whose part headers are single lines (RFC 7578 §4.2)`,
      );
    default:
      return new UploadFormError('multipart body', `'${error.message}'`, expected);
  }
}

async function collectSmallFile(
  stream: Readable & { truncated?: boolean },
  part: string,
  maxBytes: number,
): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let total = 0;
  let tooLarge = false;
  for await (const chunk of stream) {
    const bytes = chunk as Buffer;
    total += bytes.byteLength;
    if (total > maxBytes) tooLarge = true;
    else chunks.push(bytes);
  }
  if (tooLarge || stream.truncated) throw new UploadTooLargeError(part, maxBytes);
  return Buffer.concat(chunks);
}
