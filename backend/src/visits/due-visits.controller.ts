import { Controller, Get, Param, ParseUUIDPipe, Query } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiPropertyOptional,
  ApiTags,
} from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import { IsOptional, IsUUID, Matches } from 'class-validator';
import { CALENDAR_DATE_PATTERN, type DueListView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { DueVisitsService } from './due-visits.service';

export class DueQueryDto {
  @ApiPropertyOptional({ description: 'The day to compute for, YYYY-MM-DD (default: today, UTC)' })
  @IsOptional()
  @Matches(CALENDAR_DATE_PATTERN, { message: 'asOf must be a calendar date written YYYY-MM-DD' })
  asOf?: string;

  @ApiPropertyOptional({ description: 'Only this site (inside your scope)' })
  @IsOptional()
  @IsUUID()
  siteId?: string;
}

@ApiTags('visits')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@Controller('studies/:studyId/due')
export class DueVisitsController {
  constructor(private readonly due: DueVisitsService) {}

  @Get()
  @RequirePermission('read', 'Visit')
  @ApiResult('DueListView', {
    description: 'Per participant in your scope, the planned visits due or overdue',
  })
  @ApiNotFoundResponse({ description: 'No such study in your scope' })
  list(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Query() query: DueQueryDto,
  ): Promise<DueListView> {
    return this.due.list(caller, studyId, query);
  }
}
