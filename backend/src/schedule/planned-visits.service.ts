import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, In, Repository } from 'typeorm';
import type { PlannedVisitView } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { AuditedWrites } from '../audit/audited-writes';
import { nowIso } from '../common/time';
import { StudiesService } from '../studies/studies.service';
import { CreatePlannedVisitDto, UpdatePlannedVisitDto } from './dto/schedule.dto';
import { PlannedVisit } from './planned-visit.entity';
import { ScheduleError, scheduleError } from './schedule.errors';
import { toPlannedVisitView } from './schedule-views';
import {
  assertNameFree,
  assertStudyWritable,
  codesInUse,
  findStudyRow,
  studyRowScope,
} from './study-rows';

/** A study's visit schedule: the admin writes it, everyone in the study reads it. */
@Injectable()
export class PlannedVisitsService {
  constructor(
    @InjectRepository(PlannedVisit) private readonly plannedVisits: Repository<PlannedVisit>,
    private readonly studies: StudiesService,
    private readonly audited: AuditedWrites,
  ) {}

  /** The schedule in order (position, then target day). */
  async list(caller: Caller, studyId: string): Promise<PlannedVisitView[]> {
    await this.studies.findInScope(caller, 'read', studyId);
    const rows = await this.plannedVisits.find({
      where: scopedWhere<PlannedVisit>(caller.ability, 'read', 'PlannedVisit', { studyId }),
      order: { position: 'ASC', targetDay: 'ASC', name: 'ASC' },
    });
    return rows.map(toPlannedVisitView);
  }

  async create(
    caller: Caller,
    studyId: string,
    dto: CreatePlannedVisitDto,
  ): Promise<PlannedVisitView> {
    await this.studyForWrite(caller, 'create', studyId);
    const at = nowIso();
    return this.save(caller, null, async (manager) => ({
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

  async update(
    caller: Caller,
    studyId: string,
    id: string,
    dto: UpdatePlannedVisitDto,
  ): Promise<PlannedVisitView> {
    await this.studyForWrite(caller, 'update', studyId);
    const current = await this.findInStudy(caller, 'update', studyId, id);
    return this.save(caller, current, () =>
      Promise.resolve({
        ...current,
        name: dto.name ?? current.name,
        targetDay: dto.targetDay ?? current.targetDay,
        windowBeforeDays: dto.windowBeforeDays ?? current.windowBeforeDays,
        windowAfterDays: dto.windowAfterDays ?? current.windowAfterDays,
        position: dto.position ?? current.position,
        updatedAt: nowIso(),
      }),
    );
  }

  /** Deletes a planned visit no visit was registered on (409 naming the visits otherwise). */
  async remove(
    caller: Caller,
    studyId: string,
    id: string,
    reason: string | undefined,
  ): Promise<void> {
    await this.studyForWrite(caller, 'delete', studyId);
    const current = await this.findInStudy(caller, 'delete', studyId, id);
    await this.audited.remove(caller, {
      entity: PlannedVisit,
      objectType: 'PlannedVisit',
      row: current,
      reason,
      scope: studyRowScope,
      view: toPlannedVisitView,
      check: async (manager) => {
        const users = await codesInUse(
          manager,
          `SELECT p."code" AS "code" FROM "visit" v JOIN "participant" p ON p."id" = v."participantId"
            WHERE v."plannedVisitId" = ? ORDER BY p."code"`,
          id,
        );
        if (users.count > 0) {
          throw scheduleError(
            ScheduleError.PlannedVisitInUse,
            `Planned visit ${current.name} is in use: ${users.count} visit(s) were registered on it (${users.listed})`,
            { plannedVisitId: id, visits: users.count, participantCodes: users.named },
          );
        }
      },
    });
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

  private save(
    caller: Caller,
    before: PlannedVisit | null,
    build: (manager: EntityManager) => Promise<PlannedVisit>,
  ): Promise<PlannedVisitView> {
    return this.audited.save(caller, {
      entity: PlannedVisit,
      objectType: 'PlannedVisit',
      before,
      row: build,
      scope: studyRowScope,
      check: (manager, row) => assertNameFree(manager, 'planned_visit', row),
      view: toPlannedVisitView,
      duplicate: (row) =>
        scheduleError(
          ScheduleError.PlannedVisitNameTaken,
          `name: the study's schedule already has a planned visit ${row.name}`,
          { field: 'name', value: row.name },
        ),
    });
  }

  private studyForWrite(
    caller: Caller,
    action: 'create' | 'update' | 'delete',
    studyId: string,
  ): Promise<void> {
    return assertStudyWritable(this.studies, caller, 'PlannedVisit', action, studyId, 'schedule');
  }

  private findInStudy(
    caller: Caller,
    action: 'read' | 'update' | 'delete',
    studyId: string,
    id: string,
  ): Promise<PlannedVisit> {
    return findStudyRow(this.plannedVisits, caller, 'PlannedVisit', action, { id, studyId }, () =>
      scheduleError(
        ScheduleError.PlannedVisitNotFound,
        `No planned visit ${id} in study ${studyId}`,
        { field: 'id', id },
      ),
    );
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
