// A plain function over SqliteReadsService rather than an AnalysisRunsService method so that the
// participants list (a module below analysis: analysis → visits → participants) reads the
// runs through their owner without a module or file cycle; this file imports neither.
import type { RecordingState } from '@gyre/shared';
import type { ScopeSql } from '../auth/access-scope';
import type { SqliteReadsService } from '../common/database/sqlite-reads.service';
import type { AnalysisRun } from './analysis-run.entity';

/**
 * The recording states whose latest run is a visit's current numbers: the same list as
 * `CURRENT_STATES` in recordings/recordings.service.ts (a spec checks they agree), kept here
 * because importing that service would bring the module graph above participants with it.
 */
export const CURRENT_RECORDING_STATES: readonly RecordingState[] = [
  'queued',
  'computing',
  'ready',
  'failed',
];

/** The headline numbers of a current run: no curves, no summary. */
export interface CurrentRunHead {
  id: string;
  visitId: string;
  kind: AnalysisRun['kind'];
  bandSource: AnalysisRun['bandSource'];
  pafHz: number | null;
  cogHz: number | null;
  roiDeltaFHz: number | null;
}

/**
 * The current runs of these visits (or of these participants' visits): the current recordings
 * joined to their latest runs, oldest upload first, in one prepared statement whatever the
 * number of ids. `scope` (a `scopeSql` over the recording, alias `r`) narrows it to a reader.
 */
export function currentRunHeads(
  reads: SqliteReadsService,
  of: { visitIds: readonly string[] } | { participantIds: readonly string[] },
  scope: ScopeSql = { sql: '1', params: [] },
): CurrentRunHead[] {
  const [column, ids] =
    'visitIds' in of ? ['visitId', of.visitIds] : ['participantId', of.participantIds];
  if (ids.length === 0) return [];
  // The lists travel as JSON arrays (SQLite's json_each), so one statement serves any length.
  return reads.all<CurrentRunHead>(
    `SELECT run."id" AS "id", run."visitId" AS "visitId", run."kind" AS "kind",
        run."bandSource" AS "bandSource", run."pafHz" AS "pafHz", run."cogHz" AS "cogHz",
        run."roiDeltaFHz" AS "roiDeltaFHz"
      FROM "recording" r
      INNER JOIN "analysis_run" run ON run."id" = r."latestRunId"
      WHERE r."${column}" IN (SELECT value FROM json_each(?))
        AND r."state" IN (SELECT value FROM json_each(?)) AND ${scope.sql}
      ORDER BY r."createdAt" ASC, r."id" ASC`,
    [JSON.stringify(ids), JSON.stringify(CURRENT_RECORDING_STATES), ...scope.params],
  );
}
