/** Lists show live tokens, revoked ones, or both. */
export const WORKER_TOKEN_STATES = ['live', 'revoked'] as const;
export type WorkerTokenState = (typeof WORKER_TOKEN_STATES)[number];

/** The name of the token the server writes to its data folder for workers on its machine. */
export const LOCAL_WORKER_TOKEN_NAME = 'local worker';

/** `GET /api/worker-tokens`: a worker token as admins see it; its secret is never shown again. */
export interface WorkerTokenView {
  id: string;
  name: string;
  /** The server's own token for workers on its machine, replaced at every start. */
  local: boolean;
  createdAt: string;
  /** `null` when Gyre made it itself (the local token). */
  createdById: string | null;
  createdByName: string | null;
  lastUsedAt: string | null;
  revokedAt: string | null;
  revokedById: string | null;
  revokedByName: string | null;
  revokedReason: string | null;
}

/** `POST /api/worker-tokens`: the new token with its secret, shown this once only. */
export interface CreatedWorkerTokenView extends WorkerTokenView {
  /** The whole bearer value (`gyre_wt_…`) a worker sends as `Authorization: Bearer …`. */
  secret: string;
}
