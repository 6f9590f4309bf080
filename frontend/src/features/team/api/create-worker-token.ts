import type { CreatedWorkerTokenView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { isWorkerTokensKey, WORKER_TOKENS_PATH } from './worker-tokens';

/** `POST /api/worker-tokens`: a new token; the answer is the only time its secret is sent. */
export function createWorkerToken(name: string): Promise<CreatedWorkerTokenView> {
  return apiSend<CreatedWorkerTokenView>(WORKER_TOKENS_PATH, 'POST', { name });
}

export function useCreateWorkerToken() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (name: string) => {
      const created = await createWorkerToken(name);
      await mutate(isWorkerTokensKey);
      return created;
    },
    [mutate],
  );
}
