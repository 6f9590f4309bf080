import { Injectable } from '@nestjs/common';
import { scopeSql } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import type { Visit } from '../visits/visit.entity';
import type { TrendRule } from './trend-rule';

/** What a trajectory shows of a visit. */
export type TrajectoryVisit = Pick<Visit, 'id' | 'label' | 'visitDate'>;

/**
 * The rows a trajectory reads besides the runs' numbers, by prepared statements: the route is
 * hot, and the query builder cost more CPU than the rest of the request. Each gives what its
 * owner's method gives (noted at each); every row is read when asked and never kept, so a
 * change by anyone shows at the next request.
 */
@Injectable()
export class TrajectoryInputs {
  constructor(private readonly reads: SqliteReadsService) {}

  /**
   * The participant if the caller may read its results, else null: the rows
   * `ParticipantsService.findInScopeOf(caller, 'read', 'Result', id, …)` finds.
   */
  participantInScope(
    caller: Caller,
    participantId: string,
  ): { id: string; studyId: string } | null {
    const scope = scopeSql(caller.ability, 'read', 'Result', 'p');
    return this.reads.one<{ id: string; studyId: string }>(
      `SELECT p."id" AS "id", p."studyId" AS "studyId" FROM "participant" p
        WHERE p."id" = ? AND ${scope.sql}`,
      [participantId, ...scope.params],
    );
  }

  /** The participant's visits by date, then label: as `VisitsService.ofParticipant`. */
  visitsOf(participantId: string): TrajectoryVisit[] {
    return this.reads.all<TrajectoryVisit>(
      `SELECT "id", "label", "visitDate" FROM "visit" WHERE "participantId" = ?
        ORDER BY "visitDate" ASC, "label" ASC`,
      [participantId],
    );
  }

  /** Which of these visits have a raised flag (of `FlagsService.forVisits`, state raised). */
  raisedFlagVisitIds(visitIds: readonly string[]): Set<string> {
    if (visitIds.length === 0) return new Set();
    const rows = this.reads.all<{ visitId: string }>(
      `SELECT DISTINCT "visitId" FROM "flag"
        WHERE "visitId" IN (SELECT value FROM json_each(?)) AND "state" = 'raised'`,
      [JSON.stringify(visitIds)],
    );
    return new Set(rows.map((row) => row.visitId));
  }

  /** The study's trend rule (study settings `trendMinVisits`, `trendMinSpanDays`). */
  trendRuleOf(studyId: string): TrendRule {
    const study = this.reads.one<{ minVisits: number; minSpanDays: number }>(
      `SELECT "trendMinVisits" AS "minVisits", "trendMinSpanDays" AS "minSpanDays"
        FROM "study" WHERE "id" = ?`,
      [studyId],
    );
    if (study === null) throw new Error(`Study ${studyId} of a participant is missing`);
    return study;
  }
}
