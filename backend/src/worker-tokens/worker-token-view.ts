import type { WorkerTokenView } from '@gyre/shared';
import type { WorkerToken } from './worker-token.entity';

/** The row as admins see it (never the hash); `names` maps user ids to names. */
export function toWorkerTokenView(row: WorkerToken, names: Map<string, string>): WorkerTokenView {
  return {
    id: row.id,
    name: row.name,
    local: row.local,
    createdAt: row.createdAt,
    createdById: row.createdById,
    createdByName: row.createdById === null ? null : (names.get(row.createdById) ?? null),
    lastUsedAt: row.lastUsedAt,
    revokedAt: row.revokedAt,
    revokedById: row.revokedById,
    revokedByName: row.revokedById === null ? null : (names.get(row.revokedById) ?? null),
    revokedReason: row.revokedReason,
  };
}
