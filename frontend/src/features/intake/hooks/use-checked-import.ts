import { useState } from 'react';
import { ApiError, type UploadOptions } from '../../../lib/api-client';
import type { ImportOutcome } from '../api/study-import';

export type ImportStep = 'check' | 'import';

interface CheckedImportOptions<T extends ImportOutcome> {
  /** What the user has chosen, as text: an outcome shows only while the choice is unchanged. */
  selection: string;
  /** The outcome a refused import carries, or null for any other failure. */
  refusedOf: (error: unknown) => T | null;
  /** Clears the choice once an import has stored it, so a new batch starts from nothing. */
  onImported: () => void;
}

/**
 * Check first, then import (Intake's bulk and BIDS panels): the last outcome and the choice it
 * is about, the step under way with its progress, and the message of a failure.
 */
export function useCheckedImport<T extends ImportOutcome>({
  selection,
  refusedOf,
  onImported,
}: CheckedImportOptions<T>) {
  const [outcome, setOutcome] = useState<{ value: T; selection: string } | null>(null);
  const [busy, setBusy] = useState<ImportStep | null>(null);
  const [percent, setPercent] = useState(0);
  const [problem, setProblem] = useState<string | null>(null);

  const current = outcome !== null && outcome.selection === selection ? outcome.value : null;

  const run = async (dryRun: boolean, send: (options: UploadOptions) => Promise<T>) => {
    setBusy(dryRun ? 'check' : 'import');
    setProblem(null);
    setPercent(0);
    try {
      const answer = await send({ onProgress: (p) => setPercent(Math.round(p.percent)) });
      // An import clears the choice, and its outcome stays on show for the empty choice.
      setOutcome({ value: answer, selection: answer.imported ? '' : selection });
      if (answer.imported) onImported();
    } catch (error) {
      const refused = refusedOf(error);
      setOutcome(refused === null ? null : { value: refused, selection });
      if (refused === null) setProblem(error instanceof ApiError ? error.message : String(error));
    } finally {
      setBusy(null);
    }
  };

  return { current, busy, percent, problem, run };
}

export type CheckedImport = ReturnType<typeof useCheckedImport>;
