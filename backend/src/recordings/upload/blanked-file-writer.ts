import { createHash } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { unlink } from 'node:fs/promises';
import { PassThrough, Transform, type Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { IdentifyingFieldsBlanker } from './identifying-fields-blanker';

/** A recording as written to disk: SHA-256 (hex) and size of the blanked copy. */
export interface BlankedFile {
  sha256: string;
  sizeBytes: number;
}

export interface BlankedFileLimits {
  /** The largest recording kept (inclusive); a larger one is removed and `tooLarge()` thrown. */
  maxBytes: number;
  tooLarge: () => Error;
  /**
   * Stop the stream at the first byte past `maxBytes` (an entry of a zip). Off for a busboy
   * part: busboy cuts it at its own limit (`truncated`) and the parser reads on.
   */
  stopAtLimit?: boolean;
  /** Sees the raw bytes before the blanker (a meter of the whole body). */
  meter?: Transform;
}

/**
 * Streams an uploaded recording through the identifying-fields blanker, a SHA-256 and a byte
 * counter into a new private temporary file at `path`, so it never sits whole in memory and
 * the original patient and recording fields never reach the disk. On any failure the file is
 * removed before the error is thrown.
 */
export async function writeBlankedFile(
  stream: Readable & { truncated?: boolean },
  path: string,
  limits: BlankedFileLimits,
): Promise<BlankedFile> {
  const hash = createHash('sha256');
  let sizeBytes = 0;
  const counter = limits.stopAtLimit
    ? new Transform({
        transform(chunk: Buffer, _encoding, done) {
          hash.update(chunk);
          sizeBytes += chunk.byteLength;
          done(sizeBytes > limits.maxBytes ? limits.tooLarge() : null, chunk);
        },
      })
    : new PassThrough().on('data', (chunk: Buffer) => {
        hash.update(chunk);
        sizeBytes += chunk.byteLength;
      });
  let truncated = false;
  stream.on('limit', () => {
    truncated = true;
  });
  const steps = limits.meter === undefined ? [] : [limits.meter];
  try {
    await pipeline([
      stream,
      ...steps,
      new IdentifyingFieldsBlanker(),
      counter,
      createWriteStream(path, { flags: 'wx', mode: 0o600 }),
    ]);
  } catch (error) {
    stream.resume();
    await unlink(path).catch(() => undefined);
    throw error;
  }
  // The limit is the largest size accepted: exactly maxBytes is fine, one more is not.
  if (truncated || stream.truncated || sizeBytes > limits.maxBytes) {
    await unlink(path).catch(() => undefined);
    throw limits.tooLarge();
  }
  return { sha256: hash.digest('hex'), sizeBytes };
}
