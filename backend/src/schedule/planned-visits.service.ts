import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, In, Repository } from 'typeorm';
import type { PlannedVisitView } from '@gyre/shared';
import { Caller } from '../auth/decorators';
import { AuditedWrites } from '../audit/audited-writes';
import { nowIso } from '../common/time';
import { StudiesService } from '../studies/studies.service';
import { CreatePlannedVisitDto, UpdatePlannedVisitDto } from './dto/schedule.dto';
import { PlannedVisit } from './planned-visit.entity';
import { ScheduleError, scheduleError } from './schedule.errors';
import { toPlannedVisitView } from './schedule-views';
import { StudyRowKind, StudyRowsService } from './study-rows';

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
export class PlannedVisitsService extends StudyRowsService<PlannedVisit, PlannedVisitView> {
  constructor(
    @InjectRepository(PlannedVisit) private readonly plannedVisits: Repository<PlannedVisit>,
    studies: StudiesService,
    audited: AuditedWrites,
  ) {
    super(plannedVisits, studies, audited, PLANNED_VISITS);
  }

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

  update(
    caller: Caller,
    studyId: string,
    id: string,
    dto: UpdatePlannedVisitDto,
  ): Promise<PlannedVisitView> {
    return this.updateRow(caller, studyId, id, (current) => ({
      ...current,
      name: dto.name ?? current.name,
      targetDay: dto.targetDay ?? current.targetDay,
      windowBeforeDays: dto.windowBeforeDays ?? current.windowBeforeDays,
      windowAfterDays: dto.windowAfterDays ?? current.windowAfterDays,
      position: dto.position ?? current.position,
      updatedAt: nowIso(),
    }));
  }

  /** For other modules, unscoped: a study's schedule. */
  ofStudy(studyId: string, manager?: EntityManager): Promise<PlannedVisit[]> {
    return this.repo(manager).find({ where: { studyId }, order: { targetDay: 'ASC' } });
  }

  /** For other modules, unscoped: the planned visits among `ids`. */
  async byIds(ids: string[], manager?: EntityManager): Promise<PlannedVisit[]> {
    const wanted = [...new Set(ids)];
    if (wanted.length === 0) return [];
    return this.repo(manager).find({ where: { id: In(wanted) } });
  }

  /** For other modules, unscoped: the planned visit or null. */
  findById(id: string, manager?: EntityManager): Promise<PlannedVisit | null> {
    return this.repo(manager).findOneBy({ id });
  }

  private repo(manager: EntityManager | undefined): Repository<PlannedVisit> {
    return manager?.getRepository(PlannedVisit) ?? this.plannedVisits;
  }
}

async function nextPosition(manager: EntityManager, studyId: string): Promise<number> {
  const [{ next }] = (await manager.query(
    `SELECT COALESCE(MAX("position") + 1, 0) AS "next" FROM "planned_visit" WHERE "studyId" = ?`,
    [studyId],
  )) as { next: number }[];
  return next;
}
