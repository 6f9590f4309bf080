import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, In, Repository } from 'typeorm';
import { subject, type PlannedVisitView } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { AuditService } from '../audit/audit.service';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { DuplicateRowError, isUniqueViolation } from '../common/errors/unique-violation';
import { nowIso } from '../common/time';
import { StudiesService } from '../studies/studies.service';
import { CreatePlannedVisitDto, UpdatePlannedVisitDto } from './dto/schedule.dto';
import { PlannedVisit } from './planned-visit.entity';
import { StudiesError, studiesError } from '../studies/studies.errors';
import { ScheduleError, scheduleError } from './schedule.errors';
import { toPlannedVisitView } from './schedule-views';

/** A study's visit schedule: the admin writes it, everyone in the study reads it. */
@Injectable()
export class PlannedVisitsService {
  constructor(
    @InjectRepository(PlannedVisit) private readonly plannedVisits: Repository<PlannedVisit>,
    private readonly studies: StudiesService,
    private readonly writes: WriteTransactions,
    private readonly audit: AuditService,
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
    await this.writes.run(async (manager) => {
      const users = (await manager.query(
        `SELECT p."code" AS "code" FROM "visit" v JOIN "participant" p ON p."id" = v."participantId"
          WHERE v."plannedVisitId" = ? ORDER BY p."code"`,
        [id],
      )) as { code: string }[];
      if (users.length > 0) {
        const named = users.slice(0, 5).map((u) => u.code);
        const more = users.length > named.length ? ` and ${users.length - named.length} more` : '';
        throw scheduleError(
          ScheduleError.PlannedVisitInUse,
          `Planned visit ${current.name} is in use: ${users.length} visit(s) were registered on it (${named.join(', ')}${more})`,
          { plannedVisitId: id, visits: users.length, participantCodes: named },
        );
      }
      await manager.delete(PlannedVisit, { id });
      await this.audit.record({
        actor: caller.user,
        action: 'delete',
        objectType: 'PlannedVisit',
        objectId: id,
        studyId: current.studyId,
        siteId: null,
        before: toPlannedVisitView(current),
        reason: reason ?? null,
        clientIp: caller.clientIp,
      });
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

  private async save(
    caller: Caller,
    before: PlannedVisit | null,
    build: (manager: EntityManager) => Promise<PlannedVisit>,
  ): Promise<PlannedVisitView> {
    let name = before?.name ?? '';
    try {
      return await this.writes.run(async (manager) => {
        const row = await build(manager);
        name = row.name;
        await assertNameFree(manager, 'planned_visit', row.studyId, row.name, row.id);
        await manager.save(PlannedVisit, row);
        const view = toPlannedVisitView(row);
        await this.audit.record({
          actor: caller.user,
          action: before === null ? 'create' : 'update',
          objectType: 'PlannedVisit',
          objectId: row.id,
          studyId: row.studyId,
          siteId: null,
          before: before === null ? undefined : toPlannedVisitView(before),
          after: view,
          clientIp: caller.clientIp,
        });
        return view;
      });
    } catch (error) {
      if (isUniqueViolation(error)) {
        throw scheduleError(
          ScheduleError.PlannedVisitNameTaken,
          `name: the study's schedule already has a planned visit ${name}`,
          { field: 'name', value: name },
        );
      }
      throw error;
    }
  }

  private async studyForWrite(
    caller: Caller,
    action: 'create' | 'update' | 'delete',
    studyId: string,
  ): Promise<void> {
    await this.studies.findInScope(caller, 'read', studyId);
    if (!caller.ability.can(action, subject('PlannedVisit', { studyId }))) {
      throw studiesError(
        StudiesError.NotFound,
        `No study ${studyId} whose schedule you may change`,
        { id: studyId },
      );
    }
  }

  private async findInStudy(
    caller: Caller,
    action: 'read' | 'update' | 'delete',
    studyId: string,
    id: string,
  ): Promise<PlannedVisit> {
    const row = await this.plannedVisits.findOne({
      where: scopedWhere<PlannedVisit>(caller.ability, action, 'PlannedVisit', { id, studyId }),
    });
    if (row === null) {
      throw scheduleError(
        ScheduleError.PlannedVisitNotFound,
        `No planned visit ${id} in study ${studyId}`,
        { field: 'id', id },
      );
    }
    return row;
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

/**
 * Names are unique per study without regard to case (the index uses NOCASE); looking first
 * turns the usual duplicate into a clean 409 (the index stays the backstop).
 */
export async function assertNameFree(
  manager: EntityManager,
  table: 'planned_visit' | 'study_group',
  studyId: string,
  name: string,
  id: string,
): Promise<void> {
  const rows = (await manager.query(
    `SELECT 1 FROM "${table}" WHERE "studyId" = ? AND "name" = ? COLLATE NOCASE AND "id" <> ? LIMIT 1`,
    [studyId, name, id],
  )) as unknown[];
  if (rows.length > 0) throw new DuplicateRowError('duplicate');
}
