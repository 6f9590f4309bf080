import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, type SelectQueryBuilder } from 'typeorm';
import {
  visitScheduleStatus,
  type RecordingKind,
  type RecordingState,
  type VisitScheduleStatus,
} from '@gyre/shared';
import { AnalysisRun } from '../analysis/analysis-run.entity';
import { applyScope, scopeSql } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import { Participant } from '../participants/participant.entity';
import { Recording } from '../recordings/recording.entity';
import { toRecordingView } from '../recordings/recording-view';
import { CURRENT_STATES } from '../recordings/recordings.service';
import { PlannedVisit } from '../schedule/planned-visit.entity';
import { reportHeads, type ReportHead } from '../signoff/report-heads.reads';
import { Visit } from '../visits/visit.entity';

/** The visit columns every worklist item shows. */
export interface VisitFacts {
  visitId: string;
  visitLabel: string;
  visitDate: string;
  participantId: string;
  participantCode: string;
  siteId: string;
  /** The visit's window status, computed as its visit view computes it (`toVisitView`). */
  schedule: VisitScheduleStatus;
}

/** A current recording with the headline of the run behind its numbers. */
export interface CurrentRecordingRow extends VisitFacts {
  recordingId: string;
  kind: RecordingKind;
  state: RecordingState;
  latestRunId: string | null;
  updatedAt: string;
  failureMessage: string | null;
  runCreatedAt: string | null;
  suggestsSlowing: boolean;
  roiDeltaFHz: number | null;
}

/** A technician's recording that is not superseded (current, in its checks, or rejected). */
export interface UploadRow extends VisitFacts {
  recordingId: string;
  kind: RecordingKind;
  state: RecordingState;
  createdAt: string;
  updatedAt: string;
  failureMessage: string | null;
  rejection: string | null;
  hasWarnings: boolean;
}

/**
 * The worklist's reads: a fixed number of narrow queries, each over the caller's scope, with
 * only the columns the list shows (never a run's curves or summary), so the cost grows with
 * the number of rows, not with a query per visit. The rows belong to recordings/, analysis/,
 * reports/ and signoff/ (whose `reportHeads` gives the reports); this only reads them.
 */
@Injectable()
export class WorklistSources {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly reads: SqliteReadsService,
  ) {}

  /** Every current recording in the caller's scope, with its run's headline. One query. */
  async currentRecordings(caller: Caller): Promise<CurrentRecordingRow[]> {
    const query = this.recordingsWithVisits()
      .leftJoin(AnalysisRun, 'run', 'run.id = r.latestRunId')
      .addSelect('r.latestRunId', 'latestRunId')
      .addSelect('r.updatedAt', 'updatedAt')
      .addSelect('r.failureMessage', 'failureMessage')
      .addSelect('run.createdAt', 'runCreatedAt')
      .addSelect('run.suggestsSlowing', 'suggestsSlowing')
      .addSelect('run.roiDeltaFHz', 'roiDeltaFHz')
      .addSelect(VISIT_COLUMNS)
      .where('r.state IN (:...states)', { states: [...CURRENT_STATES] });
    applyScope(query, 'r', caller.ability, 'read', 'Recording');
    const rows: Array<
      RawVisit<Omit<CurrentRecordingRow, 'suggestsSlowing'>> & { suggestsSlowing: number | null }
    > = await query.getRawMany();
    return rows.map((row) => ({
      ...withSchedule(row),
      suggestsSlowing: row.suggestsSlowing === 1,
    }));
  }

  /** Every report in scope with its newest signature, if any (signoff's read). One query. */
  reports(caller: Caller): ReportHead[] {
    return reportHeads(this.reads, scopeSql(caller.ability, 'read', 'Report', 'rep'));
  }

  /** A technician's recordings that are not superseded, in their site. One query. */
  async uploads(caller: Caller): Promise<UploadRow[]> {
    const query = this.recordingsWithVisits()
      .addSelect('r.createdAt', 'createdAt')
      .addSelect('r.updatedAt', 'updatedAt')
      .addSelect('r.failureMessage', 'failureMessage')
      // SQLite's JSON1 functions: only the message leaves the rejection, only a yes/no the
      // warnings (their wording comes from the recording's own view, for the few that have any).
      .addSelect("json_extract(r.rejectionJson, '$.message')", 'rejection')
      .addSelect(
        `(r.kindConfirmed = 1
          OR (r.resultWarningsJson IS NOT NULL AND json_array_length(r.resultWarningsJson) > 0)
          OR (r.resultWarningsJson IS NULL AND r.factsJson IS NOT NULL
              AND json_array_length(r.factsJson, '$.warnings') > 0))`,
        'hasWarnings',
      )
      .addSelect(VISIT_COLUMNS)
      .where('r.state != :superseded', { superseded: 'superseded' });
    applyScope(query, 'r', caller.ability, 'read', 'Recording');
    const rows: Array<RawVisit<Omit<UploadRow, 'hasWarnings'>> & { hasWarnings: number }> =
      await query.getRawMany();
    return rows.map((row) => ({ ...withSchedule(row), hasWarnings: row.hasWarnings === 1 }));
  }

  /** The visits in the caller's scope dated on or before `date` (`YYYY-MM-DD`). One query. */
  async visitsUpTo(caller: Caller, date: string): Promise<VisitFacts[]> {
    const query = this.dataSource
      .getRepository(Visit)
      .createQueryBuilder('v')
      .innerJoin(Participant, 'p', 'p.id = v.participantId')
      .leftJoin(PlannedVisit, 'pv', 'pv.id = v.plannedVisitId')
      .select(VISIT_COLUMNS)
      .where('v.visitDate <= :date', { date });
    applyScope(query, 'v', caller.ability, 'read', 'Visit');
    const rows: RawVisit<VisitFacts>[] = await query.getRawMany();
    return rows.map(withSchedule);
  }

  /** Recordings (`r`) with their visit (`v`), participant (`p`) and planned visit (`pv`). */
  private recordingsWithVisits(): SelectQueryBuilder<Recording> {
    return this.dataSource
      .getRepository(Recording)
      .createQueryBuilder('r')
      .innerJoin(Visit, 'v', 'v.id = r.visitId')
      .innerJoin(Participant, 'p', 'p.id = v.participantId')
      .leftJoin(PlannedVisit, 'pv', 'pv.id = v.plannedVisitId')
      .select('r.id', 'recordingId')
      .addSelect('r.kind', 'kind')
      .addSelect('r.state', 'state');
  }

  /** The warnings of these recordings, worded as the recording's own view words them. */
  async warningsOf(recordingIds: readonly string[]): Promise<Map<string, string[]>> {
    const out = new Map<string, string[]>();
    for (let i = 0; i < recordingIds.length; i += CHUNK) {
      const rows = await this.dataSource.getRepository(Recording).find({
        where: { id: In(recordingIds.slice(i, i + CHUNK)) },
        // Not the onset list (thousands of onsets for a long task): the view needs only these.
        select: {
          id: true,
          kind: true,
          kindConfirmed: true,
          resultWarningsJson: true,
          factsJson: true,
        },
      });
      for (const row of rows) {
        const narrow = { ...row, csvOnsetsJson: null, rejectionJson: null, roiUsageJson: null };
        out.set(row.id, toRecordingView(narrow, null).warnings);
      }
    }
    return out;
  }
}

/** Bound parameters per IN (…) list, well under SQLite's limit of 32,766. */
export const CHUNK = 500;

const VISIT_COLUMNS = [
  'v.id AS visitId',
  'v.label AS visitLabel',
  'v.visitDate AS visitDate',
  'v.participantId AS participantId',
  'v.siteId AS siteId',
  'p.code AS participantCode',
  // What the window status needs (as `toVisitView` gets it): the participant's enrolment date
  // and the planned visit, joined in the same query (`pv`, left join: unplanned visits).
  'p.enrolmentDate AS enrolmentDate',
  'pv.id AS plannedId',
  'pv.name AS plannedName',
  'pv.targetDay AS plannedTargetDay',
  'pv.windowBeforeDays AS plannedBefore',
  'pv.windowAfterDays AS plannedAfter',
];

/** The extra raw columns behind a row's `schedule`. */
interface ScheduleColumns {
  enrolmentDate: string | null;
  plannedId: string | null;
  plannedName: string | null;
  plannedTargetDay: number | null;
  plannedBefore: number | null;
  plannedAfter: number | null;
}

/** A raw row as the query returns it: the visit columns without `schedule`, plus its inputs. */
type RawVisit<T extends VisitFacts> = Omit<T, 'schedule'> & ScheduleColumns;

/** The row with `schedule` computed by the shared function and its raw inputs dropped. */
function withSchedule<R extends ScheduleColumns & { visitDate: string }>(
  raw: R,
): Omit<R, keyof ScheduleColumns> & { schedule: VisitScheduleStatus } {
  const {
    enrolmentDate,
    plannedId,
    plannedName,
    plannedTargetDay,
    plannedBefore,
    plannedAfter,
    ...rest
  } = raw;
  const schedule = visitScheduleStatus({
    visitDate: raw.visitDate,
    enrolmentDate,
    planned:
      plannedId === null || plannedName === null
        ? null
        : {
            id: plannedId,
            name: plannedName,
            targetDay: Number(plannedTargetDay),
            windowBeforeDays: Number(plannedBefore),
            windowAfterDays: Number(plannedAfter),
          },
  });
  return { ...rest, schedule };
}
