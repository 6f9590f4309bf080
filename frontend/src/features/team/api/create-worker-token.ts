import type { CreatedWorkerTokenView } from '@gyre/shared';
import { apiSend } from '../../../lib/api-client';
import { useWrite } from '../../../lib/use-write';
import { isWorkerTokensKey, WORKER_TOKENS_PATH } from './worker-tokens';

/** `POST /api/worker-tokens`: a new token; the answer is the only time its secret is sent. */
export function createWorkerToken(name: string): Promise<CreatedWorkerTokenView> {
  return apiSend<CreatedWorkerTokenView>(WORKER_TOKENS_PATH, 'POST', { name });
}

export function useCreateWorkerToken() {
  return useWrite(createWorkerToken, (mutate) => mutate(isWorkerTokensKey));
}
