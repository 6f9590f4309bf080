import { Injectable } from '@nestjs/common';
import type { RecordingKind, RecordingState } from '@gyre/shared';
import { scopeSql } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import { KeptById } from '../common/kept-by-id';
import { CURRENT_STATES } from '../recordings/recordings.service';
import { reportHeads, type ReportHead } from '../signoff/report-heads.reads';

export interface PlannedVisitRow {
  id: string;
  name: string;
  targetDay: number;
}
export interface NamedRow {
  id: string;
  name: string;
}
export interface ParticipantRow {
  id: string;
  code: string;
  siteId: string;
  groupId: string | null;
}
export interface VisitRow {
  id: string;
  participantId: string;
  plannedVisitId: string | null;
  visitDate: string;
}

/** What the site quality comparison reads of a run's summary. */
export interface RunQuality {
  epochsDroppedShare: number | null;
  phaseSlipShare: number | null;
  lineNoiseRatio50Hz: number | null;
  lineNoiseRatio60Hz: number | null;
  roiStatus: string | null;
  roiWanted: number | null;
  roiUsed: number | null;
}

const NO_QUALITY: Readonly<RunQuality> = Object.freeze({
  epochsDroppedShare: null,
  phaseSlipShare: null,
  lineNoiseRatio50Hz: null,
  lineNoiseRatio60Hz: null,
  roiStatus: null,
  roiWanted: null,
  roiUsed: null,
});

/** Runs whose quality figures are kept: a few studies of a few hundred participants. */
const KEPT_QUALITIES = 20_000;

/** A recording that is neither rejected nor superseded, with its run's headline and quality. */
export interface LiveRecordingRow extends RunQuality {
  visitId: string;
  siteId: string;
  kind: RecordingKind;
  state: RecordingState;
  /** Set only when the recording is current (CURRENT_STATES) and has a run. */
  latestRunId: string | null;
  runCreatedAt: string | null;
  pafHz: number | null;
  cogHz: number | null;
  roiDeltaFHz: number | null;
  bandSource: string | null;
  settingsId: string | null;
  overrideRevision: number | null;
}

export interface UploadCountRow {
  siteId: string;
  uploads: number;
  rejected: number;
}

export interface ReviewRow {
  visitId: string;
  fingerprint: string;
}

/**
 * The overview's reads: a fixed number of prepared statements over one study, each limited to
 * the caller's `read StudyOverview` scope (row conditions on studyId/siteId, as scopeSql turns
 * them into SQL), each returning only the columns the overview uses. The cost grows with the
 * rows, never a query per participant or visit. The rows belong to other modules; this only
 * reads them.
 */
@Injectable()
export class StudyOverviewSources {
  /** Quality figures by run id (see qualityOfRuns). */
  private readonly qualityKept = new KeptById<Readonly<RunQuality>>(KEPT_QUALITIES);

  constructor(private readonly reads: SqliteReadsService) {}

  studyExists(studyId: string): boolean {
    return (
      this.reads.one<{ id: string }>(`SELECT "id" FROM "study" WHERE "id" = ?`, [studyId]) !== null
    );
  }

  plannedVisits(studyId: string): PlannedVisitRow[] {
    return this.reads.all(
      `SELECT "id", "name", "targetDay" FROM "planned_visit" WHERE "studyId" = ?
        ORDER BY "position" ASC, "targetDay" ASC, "name" ASC`,
      [studyId],
    );
  }

  groups(studyId: string): NamedRow[] {
    return this.reads.all(
      `SELECT "id", "name" FROM "study_group" WHERE "studyId" = ? ORDER BY "name" ASC`,
      [studyId],
    );
  }

  /** The study's sites the caller may see (a site row's own id is its siteId). */
  sites(caller: Caller, studyId: string): NamedRow[] {
    const scope = this.scope(caller, 's');
    return this.reads.all(
      `SELECT s."id" AS "id", s."name" AS "name"
        FROM (SELECT "id", "name", "studyId", "id" AS "siteId" FROM "site") s
        WHERE s."studyId" = ? AND ${scope.sql} ORDER BY s."name" ASC`,
      [studyId, ...scope.params],
    );
  }

  participants(caller: Caller, studyId: string): ParticipantRow[] {
    const scope = this.scope(caller, 'p');
    return this.reads.all(
      `SELECT p."id" AS "id", p."code" AS "code", p."siteId" AS "siteId", p."groupId" AS "groupId"
        FROM "participant" p WHERE p."studyId" = ? AND ${scope.sql} ORDER BY p."code" ASC`,
      [studyId, ...scope.params],
    );
  }

  visits(caller: Caller, studyId: string): VisitRow[] {
    const scope = this.scope(caller, 'v');
    return this.reads.all(
      `SELECT v."id" AS "id", v."participantId" AS "participantId",
          v."plannedVisitId" AS "plannedVisitId", v."visitDate" AS "visitDate"
        FROM "visit" v WHERE v."studyId" = ? AND ${scope.sql}
        ORDER BY v."visitDate" ASC, v."createdAt" ASC, v."id" ASC`,
      [studyId, ...scope.params],
    );
  }

  /**
   * Every recording neither rejected nor superseded, in upload order, with the headline and
   * the quality figures of the run behind a current one.
   */
  liveRecordings(caller: Caller, studyId: string): LiveRecordingRow[] {
    const scope = this.scope(caller, 'r');
    const rows = this.reads.all<Omit<LiveRecordingRow, keyof RunQuality>>(
      `SELECT r."visitId" AS "visitId", r."siteId" AS "siteId", r."kind" AS "kind",
          r."state" AS "state", run."id" AS "latestRunId", run."createdAt" AS "runCreatedAt",
          run."pafHz" AS "pafHz", run."cogHz" AS "cogHz", run."roiDeltaFHz" AS "roiDeltaFHz",
          run."bandSource" AS "bandSource", run."settingsId" AS "settingsId",
          run."overrideRevision" AS "overrideRevision"
        FROM "recording" r
        LEFT JOIN "analysis_run" run
          ON run."id" = r."latestRunId"
          AND r."state" IN (SELECT value FROM json_each(?))
        WHERE r."studyId" = ? AND r."state" NOT IN ('rejected', 'superseded') AND ${scope.sql}
        ORDER BY r."createdAt" ASC, r."id" ASC`,
      [JSON.stringify(CURRENT_STATES), studyId, ...scope.params],
    );
    const quality = this.qualityOfRuns(
      rows.flatMap((r) => (r.latestRunId === null ? [] : [r.latestRunId])),
    );
    return rows.map((row) => ({
      ...row,
      ...((row.latestRunId === null ? undefined : quality.get(row.latestRunId)) ?? NO_QUALITY),
    }));
  }

  /**
   * The quality figures of runs, out of their summaries with SQLite's JSON1 functions (no
   * summary text leaves the database). Reading them was most of an overview's time on a
   * few hundred participants, so each run's figures are kept: a stored run never changes
   * (runs are only ever inserted), so the kept value is the row's for good.
   */
  private qualityOfRuns(runIds: readonly string[]): Map<string, RunQuality> {
    return this.qualityKept.get(runIds, (missing) =>
      this.reads
        .all<RunQuality & { id: string }>(
          `SELECT "id",
              json_extract("summaryJson", '$.quality.epochsDroppedShare') AS "epochsDroppedShare",
              json_extract("summaryJson", '$.quality.phaseSlipShare') AS "phaseSlipShare",
              json_extract("summaryJson", '$.quality.lineNoiseRatio50Hz') AS "lineNoiseRatio50Hz",
              json_extract("summaryJson", '$.quality.lineNoiseRatio60Hz') AS "lineNoiseRatio60Hz",
              json_extract("summaryJson", '$.roiUsage.status') AS "roiStatus",
              json_array_length("summaryJson", '$.roiUsage.wanted') AS "roiWanted",
              json_array_length("summaryJson", '$.roiUsage.used') AS "roiUsed"
            FROM "analysis_run" WHERE "id" IN (SELECT value FROM json_each(?))`,
          [JSON.stringify(missing)],
        )
        .map(({ id, ...quality }) => [id, Object.freeze(quality)]),
    );
  }

  /** Every recording ever uploaded per site, and how many of them were rejected. */
  uploadCounts(caller: Caller, studyId: string): UploadCountRow[] {
    const scope = this.scope(caller, 'r');
    return this.reads.all(
      `SELECT r."siteId" AS "siteId", COUNT(*) AS "uploads",
          SUM(CASE WHEN r."state" = 'rejected' THEN 1 ELSE 0 END) AS "rejected"
        FROM "recording" r WHERE r."studyId" = ? AND ${scope.sql} GROUP BY r."siteId"`,
      [studyId, ...scope.params],
    );
  }

  /**
   * The newest review of each visit. SQLite takes the bare columns of an aggregate query from
   * the row that holds MAX() (sqlite.org/lang_select.html, "bare columns in an aggregate query").
   */
  latestReviews(caller: Caller, studyId: string): ReviewRow[] {
    const scope = this.scope(caller, 'review');
    return this.reads.all(
      `SELECT review."visitId" AS "visitId", review."fingerprint" AS "fingerprint",
          MAX(review."reviewedAt") AS "reviewedAt"
        FROM "visit_review" review WHERE review."studyId" = ? AND ${scope.sql}
        GROUP BY review."visitId"`,
      [studyId, ...scope.params],
    );
  }

  /** Every report of the study with its newest signature, if any (signoff's read). */
  reports(caller: Caller, studyId: string): ReportHead[] {
    return reportHeads(this.reads, this.scope(caller, 'rep'), { studyId });
  }

  /** The study's newest settings version (null before the first). */
  newestSettingsId(studyId: string): string | null {
    return (
      this.reads.one<{ id: string }>(
        `SELECT "id" FROM "analysis_settings" WHERE "studyId" = ? ORDER BY "version" DESC LIMIT 1`,
        [studyId],
      )?.id ?? null
    );
  }

  /** Each visit's newest override revision, for the visits that have one. */
  newestOverrideRevisions(studyId: string): Map<string, number> {
    const rows = this.reads.all<{ visitId: string; revision: number }>(
      `SELECT "visitId", MAX("revision") AS "revision" FROM "visit_analysis_override"
        WHERE "studyId" = ? GROUP BY "visitId"`,
      [studyId],
    );
    return new Map(rows.map((r) => [r.visitId, r.revision]));
  }

  private scope(caller: Caller, alias: string) {
    return scopeSql(caller.ability, 'read', 'StudyOverview', alias);
  }
}
