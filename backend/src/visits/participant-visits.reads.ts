// A plain function over SqliteReadsService so that the participants list (a module below visits)
// reads the visits through their owner without a module cycle.
import type { ScopeSql } from '../auth/access-scope';
import type { SqliteReadsService } from '../common/database/sqlite-reads.service';

export interface ParticipantVisitRow {
  id: string;
  participantId: string;
  label: string;
  visitDate: string;
}

/** These participants' visits, newest first, in one statement; `scope` is over alias `v`. */
export function visitsOfParticipants(
  reads: SqliteReadsService,
  participantIds: readonly string[],
  scope: ScopeSql,
): ParticipantVisitRow[] {
  return reads.all<ParticipantVisitRow>(
    `SELECT v."id" AS "id", v."participantId" AS "participantId", v."label" AS "label",
        v."visitDate" AS "visitDate"
      FROM "visit" v
      WHERE v."participantId" IN (SELECT value FROM json_each(?)) AND ${scope.sql}
      ORDER BY v."visitDate" DESC, v."createdAt" DESC, v."id" DESC`,
    [JSON.stringify(participantIds), ...scope.params],
  );
}
