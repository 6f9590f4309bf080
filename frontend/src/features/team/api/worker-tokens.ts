import type { WorkerTokenState, WorkerTokenView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';

export const WORKER_TOKENS_PATH = '/api/worker-tokens';

/** `GET /api/worker-tokens`: worker tokens, newest first, never their secrets. */
export function workerTokensKey(
  state: WorkerTokenState | null,
  page: number,
  pageSize: number,
): string {
  return withQuery(WORKER_TOKENS_PATH, { state, page, pageSize, order: 'desc' });
}

export function useWorkerTokens(state: WorkerTokenState | null, page: number, pageSize: number) {
  return usePage<WorkerTokenView>(workerTokensKey(state, page, pageSize));
}

/** Matches every worker-token list key, whatever its filter, so a change refreshes them all. */
export const isWorkerTokensKey = (key: unknown): boolean =>
  typeof key === 'string' &&
  (key === WORKER_TOKENS_PATH || key.startsWith(`${WORKER_TOKENS_PATH}?`));
