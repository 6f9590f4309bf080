import type { Page, WorkerTokenState, WorkerTokenView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

export const WORKER_TOKENS_PATH = '/api/worker-tokens';

/** `GET /api/worker-tokens`: worker tokens, newest first, never their secrets. */
export function workerTokensKey(
  state: WorkerTokenState | null,
  page: number,
  pageSize: number,
): string {
  return withQuery(WORKER_TOKENS_PATH, { state, page, pageSize, order: 'desc' });
}

export function getWorkerTokens(key: string): Promise<Page<WorkerTokenView>> {
  return apiFetch<Page<WorkerTokenView>>(key);
}

export function useWorkerTokens(state: WorkerTokenState | null, page: number, pageSize: number) {
  return useSWR<Page<WorkerTokenView>>(workerTokensKey(state, page, pageSize), getWorkerTokens, {
    keepPreviousData: true,
  });
}

/** Matches every worker-token list key, whatever its filter, so a change refreshes them all. */
export const isWorkerTokensKey = (key: unknown): boolean =>
  typeof key === 'string' &&
  (key === WORKER_TOKENS_PATH || key.startsWith(`${WORKER_TOKENS_PATH}?`));
