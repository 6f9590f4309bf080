import { createHash } from 'node:crypto';

/** A current recording's kind and the run behind its numbers (null while it has none). */
export interface CurrentRunRef {
  kind: string;
  latestRunId: string | null;
}

/**
 * What a review covers: the visit's current runs as `kind:runId`, sorted, and the SHA-256 of
 * that list joined by newlines. A new run (new numbers, a replaced recording, a re-run with
 * other settings) changes it; a re-run that reproduces the numbers stores no run and leaves it.
 * Null when the visit has no results.
 */
export function reviewFingerprintOf(
  current: readonly CurrentRunRef[],
): { fingerprint: string; runIds: string[] } | null {
  const runIds = current
    .flatMap((r) => (r.latestRunId === null ? [] : [`${r.kind}:${r.latestRunId}`]))
    .sort();
  if (runIds.length === 0) return null;
  return {
    fingerprint: createHash('sha256').update(runIds.join('\n')).digest('hex'),
    runIds,
  };
}
