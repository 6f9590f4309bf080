import { unlink } from 'node:fs/promises';
import { Transform } from 'node:stream';
import type { Request, Response } from 'express';

/** Reads a multi-file import's multipart body; `discard` removes what it left on disk. */
export interface MultiFileReceiver<Received> {
  receive(request: Request): Promise<Received>;
  discard(received: Received): Promise<void>;
}

/** What one multi-file import route (bulk upload, EEG-BIDS import) brings of its own. */
export interface MultiFileImportRoute<Received, Result extends { dryRun: boolean }> {
  receiver: MultiFileReceiver<Received>;
  /** The module's 400 for a `dryRun` query that is neither `true` nor `false`. */
  badDryRun: (message: string) => Error;
  /** Finds the study in the caller's scope (404 otherwise). */
  assertStudy: () => Promise<unknown>;
  run: (received: Received, dryRun: boolean) => Promise<Result>;
}

/**
 * The flow every multi-file import route shares: the `dryRun` query checked, the study found
 * in the caller's scope before a byte of the body is read, the body received, the import run
 * (a dry run answers 200, an import 201), and the temporary files removed whatever happens.
 */
export async function runMultiFileImport<Received, Result extends { dryRun: boolean }>(
  request: Request,
  response: Response,
  dryRun: string | undefined,
  route: MultiFileImportRoute<Received, Result>,
): Promise<Result> {
  if (dryRun !== undefined && dryRun !== 'true' && dryRun !== 'false') {
    throw route.badDryRun(`dryRun: '${dryRun}' found, 'true' or 'false' expected`);
  }
  await route.assertStudy();
  const received = await route.receiver.receive(request);
  try {
    const result = await route.run(received, dryRun === 'true');
    if (result.dryRun) response.status(200);
    return result;
  } finally {
    await route.receiver.discard(received);
  }
}

/**
 * Meters for the parts of one body: each one passes its bytes on and counts them against one
 * shared `maxBytes`; the byte past it fails the part with `tooLarge()`.
 */
export function sharedByteMeter(maxBytes: number, tooLarge: () => Error): () => Transform {
  let total = 0;
  return () =>
    new Transform({
      transform(chunk: Buffer, _encoding, done) {
        total += chunk.byteLength;
        done(total > maxBytes ? tooLarge() : null, chunk);
      },
    });
}

/** Removes the temporary files a receiver wrote (a file already gone is not an error). */
export async function removeTempFiles(files: Iterable<{ tempPath: string }>): Promise<void> {
  for (const file of files) await unlink(file.tempPath).catch(() => undefined);
}
