import type { WorkerTokenView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { isWorkerTokensKey, WORKER_TOKENS_PATH } from './worker-tokens';

/** `POST /api/worker-tokens/:id/revoke`: the token is refused from the next request on. */
export function revokeWorkerToken(id: string, reason?: string): Promise<WorkerTokenView> {
  return apiSend<WorkerTokenView>(
    `${WORKER_TOKENS_PATH}/${encodeURIComponent(id)}/revoke`,
    'POST',
    reason === undefined ? {} : { reason },
  );
}

export function useRevokeWorkerToken() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (id: string, reason?: string) => {
      const revoked = await revokeWorkerToken(id, reason);
      await mutate(isWorkerTokensKey);
      return revoked;
    },
    [mutate],
  );
}
