import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
  Query,
} from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNoContentResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { ReasonQueryDto } from '../common/dto/reason-query.dto';
import {
  CreatePlannedVisitDto,
  CreateStudyGroupDto,
  PlannedVisitResponseDto,
  StudyGroupResponseDto,
  UpdatePlannedVisitDto,
  UpdateStudyGroupDto,
} from './dto/schedule.dto';
import { PlannedVisitsService } from './planned-visits.service';
import { StudyGroupsService } from './study-groups.service';

@ApiTags('schedule')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@ApiNotFoundResponse({ description: 'No such study (or row) in your scope' })
@Controller('studies/:studyId')
export class ScheduleController {
  constructor(
    private readonly plannedVisits: PlannedVisitsService,
    private readonly groups: StudyGroupsService,
  ) {}

  @Get('planned-visits')
  @RequirePermission('read', 'PlannedVisit')
  @ApiOkResponse({ type: [PlannedVisitResponseDto] })
  listPlannedVisits(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
  ): Promise<PlannedVisitView[]> {
    return this.plannedVisits.list(caller, studyId);
  }

  @Post('planned-visits')
  @RequirePermission('create', 'PlannedVisit')
  @ApiCreatedResponse({ type: PlannedVisitResponseDto })
  @ApiConflictResponse({ description: 'The name is taken in this study' })
  createPlannedVisit(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Body() body: CreatePlannedVisitDto,
  ): Promise<PlannedVisitView> {
    return this.plannedVisits.create(caller, studyId, body);
  }

  @Patch('planned-visits/:id')
  @RequirePermission('update', 'PlannedVisit')
  @ApiOkResponse({ type: PlannedVisitResponseDto })
  @ApiConflictResponse({ description: 'The name is taken in this study' })
  updatePlannedVisit(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: UpdatePlannedVisitDto,
  ): Promise<PlannedVisitView> {
    return this.plannedVisits.update(caller, studyId, id, body);
  }

  @Delete('planned-visits/:id')
  @HttpCode(204)
  @RequirePermission('delete', 'PlannedVisit')
  @ApiNoContentResponse()
  @ApiConflictResponse({ description: 'Visits were registered on it' })
  removePlannedVisit(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Param('id', ParseUUIDPipe) id: string,
    @Query() query: ReasonQueryDto,
  ): Promise<void> {
    return this.plannedVisits.remove(caller, studyId, id, query.reason);
  }

  @Get('groups')
  @RequirePermission('read', 'StudyGroup')
  @ApiOkResponse({ type: [StudyGroupResponseDto] })
  listGroups(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
  ): Promise<StudyGroupView[]> {
    return this.groups.list(caller, studyId);
  }

  @Post('groups')
  @RequirePermission('create', 'StudyGroup')
  @ApiCreatedResponse({ type: StudyGroupResponseDto })
  @ApiConflictResponse({ description: 'The name is taken in this study' })
  createGroup(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Body() body: CreateStudyGroupDto,
  ): Promise<StudyGroupView> {
    return this.groups.create(caller, studyId, body);
  }

  @Patch('groups/:id')
  @RequirePermission('update', 'StudyGroup')
  @ApiOkResponse({ type: StudyGroupResponseDto })
  @ApiConflictResponse({ description: 'The name is taken in this study' })
  updateGroup(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: UpdateStudyGroupDto,
  ): Promise<StudyGroupView> {
    return this.groups.update(caller, studyId, id, body);
  }

  @Delete('groups/:id')
  @HttpCode(204)
  @RequirePermission('delete', 'StudyGroup')
  @ApiNoContentResponse()
  @ApiConflictResponse({ description: 'Participants belong to it' })
  removeGroup(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Param('id', ParseUUIDPipe) id: string,
    @Query() query: ReasonQueryDto,
  ): Promise<void> {
    return this.groups.remove(caller, studyId, id, query.reason);
  }
}
