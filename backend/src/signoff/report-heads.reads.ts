// A plain function over SqliteReadsService: the participants list (a module below signoff), the
// worklist and the study overview read report states through the module that owns the
// revisions, one statement each.
import type { ReportState } from '@gyre/shared';
import type { ScopeSql } from '../auth/access-scope';
import type { SqliteReadsService } from '../common/database/sqlite-reads.service';

/** A report's state with its newest signed revision, if any. */
export interface ReportHead {
  visitId: string;
  participantId: string;
  state: ReportState;
  createdAt: string;
  lastSignedAt: string | null;
  lastRevision: number | null;
}

/**
 * The reports in `scope` (a `scopeSql` over the report, alias `rep`), each with its newest
 * signature: all of them, those of one study, or those of `visitIds`.
 */
export function reportHeads(
  reads: SqliteReadsService,
  scope: ScopeSql,
  of: 'all' | { studyId: string } | { visitIds: readonly string[] } = 'all',
): ReportHead[] {
  const [filter, params]: [string, string[]] =
    of === 'all'
      ? ['', []]
      : 'studyId' in of
        ? ['rep."studyId" = ? AND', [of.studyId]]
        : ['rep."visitId" IN (SELECT value FROM json_each(?)) AND', [JSON.stringify(of.visitIds)]];
  return reads.all<ReportHead>(
    `SELECT rep."visitId" AS "visitId", rep."participantId" AS "participantId",
        rep."state" AS "state", rep."createdAt" AS "createdAt",
        MAX(rev."signedAt") AS "lastSignedAt", MAX(rev."revision") AS "lastRevision"
      FROM "report" rep
      LEFT JOIN "report_revision" rev ON rev."reportId" = rep."id"
      WHERE ${filter} ${scope.sql}
      GROUP BY rep."id"`,
    [...params, ...scope.params],
  );
}
