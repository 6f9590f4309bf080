import { Injectable } from '@nestjs/common';
import type { LatestValue, ParticipantListItem, RecordingState, ReportState } from '@gyre/shared';
import { scopeSql } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { SqliteReads } from '../common/database/sqlite-reads.service';

/**
 * The recording states whose latest run is a visit's current numbers: the same list as
 * `CURRENT_STATES` in recordings/recordings.service.ts (a spec checks they agree). Imported
 * here it would close a file cycle participants → recordings → visits → participants.
 */
export const CURRENT_RECORDING_STATES: readonly RecordingState[] = [
  'queued',
  'computing',
  'ready',
  'failed',
];

type Extras = Omit<ParticipantListItem, keyof import('@gyre/shared').ParticipantView>;

interface VisitRow {
  id: string;
  participantId: string;
  label: string;
  visitDate: string;
}

/**
 * What the participants list shows besides the participant rows: the site and group names,
 * visits, latest PAF and Δf, open flags and the latest visit's report. The list is a hot,
 * load-tested route, so these are a fixed number of prepared statements over the page's
 * participant ids (SqliteReads, as trajectory/trajectory-inputs.ts and
 * study-overview/study-overview-sources.ts read other modules' rows), never one per row: five
 * at most, whatever the page size. Each statement reads what its owner's method gives (noted
 * at each) and applies the caller's own scope for that subject, so a technician's list has
 * no results, flags or reports (null), and a coordinator sees signed and sent reports only.
 */
@Injectable()
export class ParticipantListExtras {
  constructor(private readonly reads: SqliteReads) {}

  of(caller: Caller, participantIds: readonly string[]): Map<string, Extras> {
    const out = new Map<string, Extras>();
    if (participantIds.length === 0) return out;
    const ids = JSON.stringify(participantIds);

    // 1. Site and group names (SitesService / StudyGroupsService rows).
    const names = this.reads.all<{ id: string; siteName: string; groupName: string | null }>(
      `SELECT p."id" AS "id", s."name" AS "siteName", g."name" AS "groupName"
        FROM "participant" p
        INNER JOIN "site" s ON s."id" = p."siteId"
        LEFT JOIN "study_group" g ON g."id" = p."groupId"
        WHERE p."id" IN (SELECT value FROM json_each(?))`,
      [ids],
    );
    for (const row of names) {
      out.set(row.id, {
        siteName: row.siteName,
        groupName: row.groupName,
        visitCount: 0,
        latestPaf: null,
        latestDeltaF: null,
        openFlags: null,
        latestVisit: null,
      });
    }

    // 2. The visits, newest first (VisitsService.ofParticipant's rows, read Visit scope).
    const visitScope = scopeSql(caller.ability, 'read', 'Visit', 'v');
    const visits = this.reads.all<VisitRow>(
      `SELECT v."id" AS "id", v."participantId" AS "participantId", v."label" AS "label",
          v."visitDate" AS "visitDate"
        FROM "visit" v
        WHERE v."participantId" IN (SELECT value FROM json_each(?)) AND ${visitScope.sql}
        ORDER BY v."visitDate" DESC, v."createdAt" DESC, v."id" DESC`,
      [ids, ...visitScope.params],
    );
    const visitById = new Map(visits.map((v) => [v.id, v]));
    const order = new Map(visits.map((v, index) => [v.id, index]));
    for (const visit of visits) {
      const extras = out.get(visit.participantId);
      if (extras === undefined) continue;
      extras.visitCount += 1;
      extras.latestVisit ??= {
        id: visit.id,
        label: visit.label,
        visitDate: visit.visitDate,
        report: null,
      };
    }

    // 3. Current numbers (AnalysisRunsService.currentRunNumbersOfVisits: the current
    //    recordings joined to their latest runs), read Result scope.
    if (caller.ability.can('read', 'Result')) {
      const scope = scopeSql(caller.ability, 'read', 'Result', 'r');
      const runs = this.reads.all<{
        visitId: string;
        kind: 'task' | 'resting';
        pafHz: number | null;
        roiDeltaFHz: number | null;
      }>(
        `SELECT run."visitId" AS "visitId", run."kind" AS "kind", run."pafHz" AS "pafHz",
            run."roiDeltaFHz" AS "roiDeltaFHz"
          FROM "recording" r
          INNER JOIN "analysis_run" run ON run."id" = r."latestRunId"
          WHERE r."participantId" IN (SELECT value FROM json_each(?))
            AND r."state" IN (SELECT value FROM json_each(?)) AND ${scope.sql}`,
        [ids, JSON.stringify(CURRENT_RECORDING_STATES), ...scope.params],
      );
      // Newest visit first, so the first value met per participant is the latest.
      runs.sort((a, b) => (order.get(a.visitId) ?? 1e9) - (order.get(b.visitId) ?? 1e9));
      for (const run of runs) {
        const visit = visitById.get(run.visitId);
        const extras = visit === undefined ? undefined : out.get(visit.participantId);
        if (visit === undefined || extras === undefined) continue;
        const value = (hz: number): LatestValue => ({
          hz,
          visitId: visit.id,
          visitLabel: visit.label,
        });
        if (run.kind === 'resting' && run.pafHz !== null) extras.latestPaf ??= value(run.pafHz);
        if (run.kind === 'task' && run.roiDeltaFHz !== null) {
          extras.latestDeltaF ??= value(run.roiDeltaFHz);
        }
      }
    }

    // 4. Raised flags (FlagsService.forVisits, state raised), read Flag scope.
    if (caller.ability.can('read', 'Flag')) {
      const scope = scopeSql(caller.ability, 'read', 'Flag', 'f');
      const counts = this.reads.all<{ participantId: string; raised: number }>(
        `SELECT f."participantId" AS "participantId", COUNT(*) AS "raised"
          FROM "flag" f
          WHERE f."participantId" IN (SELECT value FROM json_each(?)) AND f."state" = 'raised'
            AND ${scope.sql}
          GROUP BY f."participantId"`,
        [ids, ...scope.params],
      );
      for (const extras of out.values()) extras.openFlags = 0;
      for (const row of counts) {
        const extras = out.get(row.participantId);
        if (extras !== undefined) extras.openFlags = row.raised;
      }
    }

    // 5. The latest visits' reports with their newest signed revision (ReportsService's
    //    report row, SignoffService's revisions), read Report scope.
    const latestVisitIds = [...out.values()].flatMap((e) =>
      e.latestVisit === null ? [] : [e.latestVisit.id],
    );
    if (caller.ability.can('read', 'Report') && latestVisitIds.length > 0) {
      const scope = scopeSql(caller.ability, 'read', 'Report', 'rep');
      const reports = this.reads.all<{
        participantId: string;
        state: ReportState;
        latestRevision: number | null;
      }>(
        `SELECT rep."participantId" AS "participantId", rep."state" AS "state",
            MAX(rev."revision") AS "latestRevision"
          FROM "report" rep
          LEFT JOIN "report_revision" rev ON rev."reportId" = rep."id"
          WHERE rep."visitId" IN (SELECT value FROM json_each(?)) AND ${scope.sql}
          GROUP BY rep."id"`,
        [JSON.stringify(latestVisitIds), ...scope.params],
      );
      for (const row of reports) {
        const latest = out.get(row.participantId)?.latestVisit;
        if (latest !== null && latest !== undefined) {
          latest.report = { state: row.state, latestRevision: row.latestRevision };
        }
      }
    }
    return out;
  }
}
