import { Injectable } from '@nestjs/common';
import type { LatestValue, ParticipantListItem } from '@gyre/shared';
import { currentRunHeads } from '../analysis/current-run-heads.reads';
import { scopeSql } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import { raisedFlagCounts } from '../flags/raised-flags.reads';
import { reportHeads } from '../signoff/report-heads.reads';
import { visitsOfParticipants } from '../visits/participant-visits.reads';

type Extras = Omit<ParticipantListItem, keyof import('@gyre/shared').ParticipantView>;

/**
 * What the participants list shows besides the participant rows: the site and group names,
 * visits, latest PAF and Δf, open flags and the latest visit's report. The list is a hot,
 * load-tested route, so these are a fixed number of prepared statements over the page's
 * participant ids, never one per row: five at most, whatever the page size. Each is its owning
 * module's read (a `*.reads.ts` function of visits/, analysis/, flags/ and signoff/, plain
 * functions because those modules sit above this one) under the caller's own scope for that
 * subject, so a technician's list has no results, flags or reports (null), and a coordinator
 * sees signed and sent reports only.
 */
@Injectable()
export class ParticipantListExtras {
  constructor(private readonly reads: SqliteReadsService) {}

  /**
   * `unblinded`: for an analyst under blinded review, the only visits they may see (those they
   * recorded their decision on); null for everyone else.
   */
  of(
    caller: Caller,
    participantIds: readonly string[],
    unblinded: readonly string[] | null = null,
  ): Map<string, Extras> {
    const out = new Map<string, Extras>();
    if (participantIds.length === 0) return out;

    // 1. The participant rows' site and group names (joined on their foreign keys).
    const names = this.reads.all<{ id: string; siteName: string; groupName: string | null }>(
      `SELECT p."id" AS "id", s."name" AS "siteName", g."name" AS "groupName"
        FROM "participant" p
        INNER JOIN "site" s ON s."id" = p."siteId"
        LEFT JOIN "study_group" g ON g."id" = p."groupId"
        WHERE p."id" IN (SELECT value FROM json_each(?))`,
      [JSON.stringify(participantIds)],
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

    // 2. The visits, newest first, read Visit scope.
    const shown = unblinded === null ? null : new Set(unblinded);
    const visits = visitsOfParticipants(
      this.reads,
      participantIds,
      scopeSql(caller.ability, 'read', 'Visit', 'v'),
    ).filter((v) => shown?.has(v.id) ?? true);
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

    // 3. Current numbers (the current recordings' latest runs), read Result scope.
    if (caller.ability.can('read', 'Result')) {
      const runs = currentRunHeads(
        this.reads,
        { participantIds },
        scopeSql(caller.ability, 'read', 'Result', 'r'),
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

    // 4. Raised flags, read Flag scope.
    if (caller.ability.can('read', 'Flag')) {
      const counts = raisedFlagCounts(
        this.reads,
        participantIds,
        scopeSql(caller.ability, 'read', 'Flag', 'f'),
      );
      for (const extras of out.values()) extras.openFlags = 0;
      for (const row of counts) {
        const extras = out.get(row.participantId);
        if (extras !== undefined) extras.openFlags = row.raised;
      }
    }

    // 5. The latest visits' reports with their newest signed revision, read Report scope.
    const latestVisitIds = [...out.values()].flatMap((e) =>
      e.latestVisit === null ? [] : [e.latestVisit.id],
    );
    if (caller.ability.can('read', 'Report') && latestVisitIds.length > 0) {
      const reports = reportHeads(this.reads, scopeSql(caller.ability, 'read', 'Report', 'rep'), {
        visitIds: latestVisitIds,
      });
      for (const row of reports) {
        const latest = out.get(row.participantId)?.latestVisit;
        if (latest !== null && latest !== undefined) {
          latest.report = { state: row.state, latestRevision: row.lastRevision };
        }
      }
    }
    return out;
  }
}
