import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, Repository } from 'typeorm';
import { subject, type StudyGroupView } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { AuditService } from '../audit/audit.service';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { isUniqueViolation } from '../common/errors/unique-violation';
import { nowIso } from '../common/time';
import { StudiesService } from '../studies/studies.service';
import { CreateStudyGroupDto, UpdateStudyGroupDto } from './dto/schedule.dto';
import { assertNameFree } from './planned-visits.service';
import { StudiesError, studiesError } from '../studies/studies.errors';
import { ScheduleError, scheduleError } from './schedule.errors';
import { toStudyGroupView } from './schedule-views';
import { StudyGroup } from './study-group.entity';

/** A study's groups or arms: the admin writes them, everyone in the study reads them. */
@Injectable()
export class StudyGroupsService {
  constructor(
    @InjectRepository(StudyGroup) private readonly groups: Repository<StudyGroup>,
    private readonly studies: StudiesService,
    private readonly writes: WriteTransactions,
    private readonly audit: AuditService,
  ) {}

  async list(caller: Caller, studyId: string): Promise<StudyGroupView[]> {
    await this.studies.findInScope(caller, 'read', studyId);
    const rows = await this.groups.find({
      where: scopedWhere<StudyGroup>(caller.ability, 'read', 'StudyGroup', { studyId }),
      order: { name: 'ASC' },
    });
    return rows.map(toStudyGroupView);
  }

  async create(caller: Caller, studyId: string, dto: CreateStudyGroupDto): Promise<StudyGroupView> {
    await this.studyForWrite(caller, 'create', studyId);
    const at = nowIso();
    return this.save(caller, null, {
      id: randomUUID(),
      studyId,
      name: dto.name,
      description: dto.description ?? '',
      createdAt: at,
      updatedAt: at,
    });
  }

  async update(
    caller: Caller,
    studyId: string,
    id: string,
    dto: UpdateStudyGroupDto,
  ): Promise<StudyGroupView> {
    await this.studyForWrite(caller, 'update', studyId);
    const current = await this.findInStudy(caller, 'update', studyId, id);
    return this.save(caller, current, {
      ...current,
      name: dto.name ?? current.name,
      description: dto.description ?? current.description,
      updatedAt: nowIso(),
    });
  }

  /** Deletes a group no participant belongs to (409 naming the participants otherwise). */
  async remove(
    caller: Caller,
    studyId: string,
    id: string,
    reason: string | undefined,
  ): Promise<void> {
    await this.studyForWrite(caller, 'delete', studyId);
    const current = await this.findInStudy(caller, 'delete', studyId, id);
    await this.writes.run(async (manager) => {
      const members = (await manager.query(
        `SELECT "code" FROM "participant" WHERE "groupId" = ? ORDER BY "code"`,
        [id],
      )) as { code: string }[];
      if (members.length > 0) {
        const named = members.slice(0, 5).map((m) => m.code);
        const more =
          members.length > named.length ? ` and ${members.length - named.length} more` : '';
        throw scheduleError(
          ScheduleError.GroupInUse,
          `Group ${current.name} is in use: ${members.length} participant(s) belong to it (${named.join(', ')}${more})`,
          { groupId: id, participants: members.length, participantCodes: named },
        );
      }
      await manager.delete(StudyGroup, { id });
      await this.audit.record({
        actor: caller.user,
        action: 'delete',
        objectType: 'StudyGroup',
        objectId: id,
        studyId: current.studyId,
        siteId: null,
        before: toStudyGroupView(current),
        reason: reason ?? null,
        clientIp: caller.clientIp,
      });
    });
  }

  /** For other modules, unscoped: the group or null. */
  findById(id: string, manager?: EntityManager): Promise<StudyGroup | null> {
    return (manager?.getRepository(StudyGroup) ?? this.groups).findOneBy({ id });
  }

  private async save(
    caller: Caller,
    before: StudyGroup | null,
    row: StudyGroup,
  ): Promise<StudyGroupView> {
    try {
      return await this.writes.run(async (manager) => {
        await assertNameFree(manager, 'study_group', row.studyId, row.name, row.id);
        await manager.save(StudyGroup, row);
        const view = toStudyGroupView(row);
        await this.audit.record({
          actor: caller.user,
          action: before === null ? 'create' : 'update',
          objectType: 'StudyGroup',
          objectId: row.id,
          studyId: row.studyId,
          siteId: null,
          before: before === null ? undefined : toStudyGroupView(before),
          after: view,
          clientIp: caller.clientIp,
        });
        return view;
      });
    } catch (error) {
      if (isUniqueViolation(error)) {
        throw scheduleError(
          ScheduleError.GroupNameTaken,
          `name: the study already has a group ${row.name}`,
          { field: 'name', value: row.name },
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
    if (!caller.ability.can(action, subject('StudyGroup', { studyId }))) {
      throw studiesError(StudiesError.NotFound, `No study ${studyId} whose groups you may change`, {
        id: studyId,
      });
    }
  }

  private async findInStudy(
    caller: Caller,
    action: 'read' | 'update' | 'delete',
    studyId: string,
    id: string,
  ): Promise<StudyGroup> {
    const row = await this.groups.findOne({
      where: scopedWhere<StudyGroup>(caller.ability, action, 'StudyGroup', { id, studyId }),
    });
    if (row === null) {
      throw scheduleError(ScheduleError.GroupNotFound, `No group ${id} in study ${studyId}`, {
        field: 'id',
        id,
      });
    }
    return row;
  }
}
