import { Body, Controller, Param, Query } from '@nestjs/common';
import { ApiNotFoundResponse } from '@nestjs/swagger';
import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { CurrentCaller, type Caller } from '../auth/decorators';
import { ReasonQueryDto } from '../common/dto/reason-query.dto';
import { CreateRoute, DeleteRoute, ListRoute, UpdateRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import {
  CreatePlannedVisitDto,
  CreateStudyGroupDto,
  UpdatePlannedVisitDto,
  UpdateStudyGroupDto,
} from './dto/schedule.dto';
import { PlannedVisitsService } from './planned-visits.service';
import { StudyGroupsService } from './study-groups.service';

const NAME_TAKEN = 'The name is taken in this study';

@ScopedController('schedule')
@ApiNotFoundResponse({ description: 'No such study (or row) in your scope' })
@Controller('studies/:studyId')
export class ScheduleController {
  constructor(
    private readonly plannedVisits: PlannedVisitsService,
    private readonly groups: StudyGroupsService,
  ) {}

  @ListRoute('PlannedVisit', 'PlannedVisitView', {
    path: 'planned-visits',
    description: "The study's planned visits in schedule order",
    array: true,
  })
  listPlannedVisits(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
  ): Promise<PlannedVisitView[]> {
    return this.plannedVisits.list(caller, studyId);
  }

  @CreateRoute('PlannedVisit', 'PlannedVisitView', {
    path: 'planned-visits',
    description: 'The new planned visit (audited)',
    conflict: NAME_TAKEN,
  })
  createPlannedVisit(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Body() body: CreatePlannedVisitDto,
  ): Promise<PlannedVisitView> {
    return this.plannedVisits.create(caller, studyId, body);
  }

  @UpdateRoute('PlannedVisit', 'PlannedVisitView', {
    path: 'planned-visits/:id',
    description: 'The changed planned visit',
    conflict: NAME_TAKEN,
  })
  updatePlannedVisit(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Param('id') id: string,
    @Body() body: UpdatePlannedVisitDto,
  ): Promise<PlannedVisitView> {
    return this.plannedVisits.update(caller, studyId, id, body);
  }

  @DeleteRoute('PlannedVisit', {
    path: 'planned-visits/:id',
    conflict: 'Visits were registered on it',
  })
  removePlannedVisit(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Param('id') id: string,
    @Query() query: ReasonQueryDto,
  ): Promise<void> {
    return this.plannedVisits.remove(caller, studyId, id, query.reason);
  }

  @ListRoute('StudyGroup', 'StudyGroupView', {
    path: 'groups',
    description: "The study's groups (arms)",
    array: true,
  })
  listGroups(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
  ): Promise<StudyGroupView[]> {
    return this.groups.list(caller, studyId);
  }

  @CreateRoute('StudyGroup', 'StudyGroupView', {
    path: 'groups',
    description: 'The new group (audited)',
    conflict: NAME_TAKEN,
  })
  createGroup(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Body() body: CreateStudyGroupDto,
  ): Promise<StudyGroupView> {
    return this.groups.create(caller, studyId, body);
  }

  @UpdateRoute('StudyGroup', 'StudyGroupView', {
    path: 'groups/:id',
    description: 'The changed group',
    conflict: NAME_TAKEN,
  })
  updateGroup(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Param('id') id: string,
    @Body() body: UpdateStudyGroupDto,
  ): Promise<StudyGroupView> {
    return this.groups.update(caller, studyId, id, body);
  }

  @DeleteRoute('StudyGroup', { path: 'groups/:id', conflict: 'Participants belong to it' })
  removeGroup(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Param('id') id: string,
    @Query() query: ReasonQueryDto,
  ): Promise<void> {
    return this.groups.remove(caller, studyId, id, query.reason);
  }
}
