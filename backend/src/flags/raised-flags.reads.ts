// A plain function over SqliteReadsService so that the participants list (a module below flags)
// counts flags through their owner without a module cycle.
import type { ScopeSql } from '../auth/access-scope';
import type { SqliteReadsService } from '../common/database/sqlite-reads.service';

/** Raised slowing flags per participant, in one statement; `scope` is over alias `f`. */
export function raisedFlagCounts(
  reads: SqliteReadsService,
  participantIds: readonly string[],
  scope: ScopeSql,
): { participantId: string; raised: number }[] {
  return reads.all(
    `SELECT f."participantId" AS "participantId", COUNT(*) AS "raised"
      FROM "flag" f
      WHERE f."participantId" IN (SELECT value FROM json_each(?)) AND f."state" = 'raised'
        AND ${scope.sql}
      GROUP BY f."participantId"`,
    [JSON.stringify(participantIds), ...scope.params],
  );
}
