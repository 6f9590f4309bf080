import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import type { StudyGroupView } from '@gyre/shared';
import { Caller } from '../auth/decorators';
import { nowIso } from '../common/time';
import { CreateStudyGroupDto } from './dto/schedule.dto';
import { ScheduleError, scheduleError } from './schedule.errors';
import { toStudyGroupView } from './schedule-views';
import { StudyGroup } from './study-group.entity';
import { StudyRowKind, StudyRowsServiceFor } from './study-rows';

const STUDY_GROUPS: StudyRowKind<StudyGroup, StudyGroupView> = {
  entity: StudyGroup,
  subject: 'StudyGroup',
  table: 'study_group',
  part: 'groups',
  order: { name: 'ASC' },
  view: toStudyGroupView,
  notFound: (studyId, id) =>
    scheduleError(ScheduleError.GroupNotFound, `No group ${id} in study ${studyId}`, {
      field: 'id',
      id,
    }),
  nameTaken: (group) =>
    scheduleError(
      ScheduleError.GroupNameTaken,
      `name: the study already has a group ${group.name}`,
      {
        field: 'name',
        value: group.name,
      },
    ),
  usersSql: `SELECT "code" FROM "participant" WHERE "groupId" = ? ORDER BY "code"`,
  inUse: (group, members) =>
    scheduleError(
      ScheduleError.GroupInUse,
      `Group ${group.name} is in use: ${members.count} participant(s) belong to it (${members.listed})`,
      { groupId: group.id, participants: members.count, participantCodes: members.named },
    ),
};

/** A study's groups or arms: the admin writes them, everyone in the study reads them. */
@Injectable()
export class StudyGroupsService extends StudyRowsServiceFor(STUDY_GROUPS) {
  create(caller: Caller, studyId: string, dto: CreateStudyGroupDto): Promise<StudyGroupView> {
    const at = nowIso();
    return this.createRow(caller, studyId, () =>
      Promise.resolve({
        id: randomUUID(),
        studyId,
        name: dto.name,
        description: dto.description ?? '',
        createdAt: at,
        updatedAt: at,
      }),
    );
  }
}
