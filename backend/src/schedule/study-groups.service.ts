import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, Repository } from 'typeorm';
import type { StudyGroupView } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { AuditedWrites } from '../audit/audited-writes';
import { nowIso } from '../common/time';
import { StudiesService } from '../studies/studies.service';
import { CreateStudyGroupDto, UpdateStudyGroupDto } from './dto/schedule.dto';
import { ScheduleError, scheduleError } from './schedule.errors';
import { toStudyGroupView } from './schedule-views';
import { StudyGroup } from './study-group.entity';
import {
  assertNameFree,
  assertStudyWritable,
  codesInUse,
  findStudyRow,
  studyRowScope,
} from './study-rows';

/** A study's groups or arms: the admin writes them, everyone in the study reads them. */
@Injectable()
export class StudyGroupsService {
  constructor(
    @InjectRepository(StudyGroup) private readonly groups: Repository<StudyGroup>,
    private readonly studies: StudiesService,
    private readonly audited: AuditedWrites,
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
    await this.audited.remove(caller, {
      entity: StudyGroup,
      objectType: 'StudyGroup',
      row: current,
      reason,
      scope: studyRowScope,
      view: toStudyGroupView,
      check: async (manager) => {
        const members = await codesInUse(
          manager,
          `SELECT "code" FROM "participant" WHERE "groupId" = ? ORDER BY "code"`,
          id,
        );
        if (members.count > 0) {
          throw scheduleError(
            ScheduleError.GroupInUse,
            `Group ${current.name} is in use: ${members.count} participant(s) belong to it (${members.listed})`,
            { groupId: id, participants: members.count, participantCodes: members.named },
          );
        }
      },
    });
  }

  /** For other modules, unscoped: the group or null. */
  findById(id: string, manager?: EntityManager): Promise<StudyGroup | null> {
    return (manager?.getRepository(StudyGroup) ?? this.groups).findOneBy({ id });
  }

  private save(
    caller: Caller,
    before: StudyGroup | null,
    row: StudyGroup,
  ): Promise<StudyGroupView> {
    return this.audited.save(caller, {
      entity: StudyGroup,
      objectType: 'StudyGroup',
      before,
      row,
      scope: studyRowScope,
      check: (manager, group) => assertNameFree(manager, 'study_group', group),
      view: toStudyGroupView,
      duplicate: (group) =>
        scheduleError(
          ScheduleError.GroupNameTaken,
          `name: the study already has a group ${group.name}`,
          { field: 'name', value: group.name },
        ),
    });
  }

  private studyForWrite(
    caller: Caller,
    action: 'create' | 'update' | 'delete',
    studyId: string,
  ): Promise<void> {
    return assertStudyWritable(this.studies, caller, 'StudyGroup', action, studyId, 'groups');
  }

  private findInStudy(
    caller: Caller,
    action: 'read' | 'update' | 'delete',
    studyId: string,
    id: string,
  ): Promise<StudyGroup> {
    return findStudyRow(this.groups, caller, 'StudyGroup', action, { id, studyId }, () =>
      scheduleError(ScheduleError.GroupNotFound, `No group ${id} in study ${studyId}`, {
        field: 'id',
        id,
      }),
    );
  }
}
