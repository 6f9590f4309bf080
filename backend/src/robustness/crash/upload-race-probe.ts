/**
 * Two different resting recordings uploaded at the same moment to one visit. The database
 * accepts only one current recording of a kind per visit, so one upload is accepted and the
 * other refused (409) when its acceptance collides with the first; docs/reliability.md
 * promises that a refused upload leaves nothing behind. Run on the crash test's server after
 * its checks (see `CrashTestOptions.probe`).
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { RecordingView } from '@gyre/shared';
import type { ProbeContext } from './crash-test';
import { Rng } from '../seeded-random';
import { restingUpload } from './recording-files';

/** The refusal of an upload whose acceptance collided with another (recordings.service.ts). */
const COLLISION = /accepted for this visit while this one was checked/;

export interface UploadRaceResult {
  /** Whether an attempt reached the collision (both passed the early check, one lost). */
  collided: boolean;
  statuses: number[];
  /** The refused upload's recording state and whether its file is in uploads/. */
  refused: { state: string | null; fileKept: boolean } | null;
}

export async function uploadRaceProbe(context: ProbeContext): Promise<UploadRaceResult> {
  const rng = new Rng(7);
  // Long enough that validating the first takes a while: the second arrives before the first
  // is accepted, passes the early check, and collides in the accepting transaction.
  const sizes = { restingS: [600], taskS: [] };
  let statuses: number[] = [];
  // One visit per attempt: the timing is the server's, so a first attempt may miss the collision.
  for (let attempt = 0; attempt < context.visitIds.length; attempt++) {
    const visitId = context.visitIds[attempt];
    const files = [1, 2].map((n) => restingUpload(rng, sizes, 70_000 + 10 * attempt + n));
    const responses = await Promise.all(files.map((file) => context.client.upload(visitId, file)));
    statuses = responses.map((r) => r.status).sort();
    const lost = responses.find(
      (r) => r.status === 409 && COLLISION.test((r.body as { message?: string })?.message ?? ''),
    );
    if (lost === undefined) continue;
    const id = (lost.body as { details?: { recording?: RecordingView } }).details?.recording?.id;
    const [row] = (await context.dataSource.query(
      `SELECT "state", "checksumSha256" FROM "recording" WHERE "id" = ?`,
      [id ?? ''],
    )) as Array<{ state: string; checksumSha256: string }>;
    return {
      collided: true,
      statuses,
      refused: {
        state: row?.state ?? null,
        fileKept:
          row !== undefined &&
          existsSync(join(context.dataDir, 'uploads', `${row.checksumSha256}.edf`)),
      },
    };
  }
  return { collided: false, statuses, refused: null };
}
