import { useCallback, useState } from 'react';
import { ApiError } from './api-client';

/**
 * One save at a time from a form or a button: `run` starts the work and returns at once (React
 * and antd handlers return nothing), `busy` is true while it runs, and `error` holds the
 * server's words for a refusal, or `failureText` for anything else (`errorCode`: the server's
 * code of the refusal). Every failure is caught here, so nothing is lost by not awaiting `run`.
 */
export function useSubmission(failureText: string) {
  const [busy, setBusy] = useState(false);
  const [failure, setFailure] = useState<{ message: string; code: string | null } | null>(null);
  const run = useCallback(
    (work: () => Promise<void>) => {
      setBusy(true);
      setFailure(null);
      // Fire and forget: the outcome reaches the screen through `busy` and `error`.
      void work()
        .catch((caught: unknown) =>
          setFailure(
            caught instanceof ApiError
              ? { message: caught.message, code: caught.code }
              : { message: failureText, code: null },
          ),
        )
        .finally(() => setBusy(false));
    },
    [failureText],
  );
  const clear = useCallback(() => setFailure(null), []);
  return { busy, error: failure?.message ?? null, errorCode: failure?.code ?? null, run, clear };
}
