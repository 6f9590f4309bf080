import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { EntityManager } from 'typeorm';
import type { PlannedVisitView } from '@gyre/shared';
import { Caller } from '../auth/decorators';
import { nowIso } from '../common/time';
import { CreatePlannedVisitDto } from './dto/schedule.dto';
import { PlannedVisit } from './planned-visit.entity';
import { ScheduleError, scheduleError } from './schedule.errors';
import { toPlannedVisitView } from './schedule-views';
import { StudyRowKind, StudyRowsServiceFor } from './study-rows';

const PLANNED_VISITS: StudyRowKind<PlannedVisit, PlannedVisitView> = {
  entity: PlannedVisit,
  subject: 'PlannedVisit',
  table: 'planned_visit',
  part: 'schedule',
  // The schedule in order (position, then target day).
  order: { position: 'ASC', targetDay: 'ASC', name: 'ASC' },
  view: toPlannedVisitView,
  notFound: (studyId, id) =>
    scheduleError(
      ScheduleError.PlannedVisitNotFound,
      `No planned visit ${id} in study ${studyId}`,
      {
        field: 'id',
        id,
      },
    ),
  nameTaken: (row) =>
    scheduleError(
      ScheduleError.PlannedVisitNameTaken,
      `name: the study's schedule already has a planned visit ${row.name}`,
      { field: 'name', value: row.name },
    ),
  usersSql: `SELECT p."code" AS "code" FROM "visit" v JOIN "participant" p ON p."id" = v."participantId"
    WHERE v."plannedVisitId" = ? ORDER BY p."code"`,
  inUse: (row, users) =>
    scheduleError(
      ScheduleError.PlannedVisitInUse,
      `Planned visit ${row.name} is in use: ${users.count} visit(s) were registered on it (${users.listed})`,
      { plannedVisitId: row.id, visits: users.count, participantCodes: users.named },
    ),
};

/** A study's visit schedule: the admin writes it, everyone in the study reads it. */
@Injectable()
export class PlannedVisitsService extends StudyRowsServiceFor(PLANNED_VISITS) {
  create(caller: Caller, studyId: string, dto: CreatePlannedVisitDto): Promise<PlannedVisitView> {
    const at = nowIso();
    return this.createRow(caller, studyId, async (manager) => ({
      id: randomUUID(),
      studyId,
      name: dto.name,
      targetDay: dto.targetDay,
      windowBeforeDays: dto.windowBeforeDays,
      windowAfterDays: dto.windowAfterDays,
      position: dto.position ?? (await nextPosition(manager, studyId)),
      createdAt: at,
      updatedAt: at,
    }));
  }

  /** For other modules, unscoped: a study's schedule. */
  ofStudy(studyId: string, manager?: EntityManager): Promise<PlannedVisit[]> {
    return this.repo(manager).find({ where: { studyId }, order: { targetDay: 'ASC' } });
  }
}

async function nextPosition(manager: EntityManager, studyId: string): Promise<number> {
  const [{ next }] = (await manager.query(
    `SELECT COALESCE(MAX("position") + 1, 0) AS "next" FROM "planned_visit" WHERE "studyId" = ?`,
    [studyId],
  )) as { next: number }[];
  return next;
}
