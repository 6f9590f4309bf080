import { Controller, Get, Param } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { StudyOverviewView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { StudyOverviewService } from './study-overview.service';

@ApiTags('study-overview')
@ApiBearerAuth()
@Controller('studies/:studyId/overview')
export class StudyOverviewController {
  constructor(private readonly overview: StudyOverviewService) {}

  @Get()
  @RequirePermission('read', 'StudyOverview')
  @ApiResult('StudyOverviewView', {
    description:
      'Per planned visit: each participant’s PAF, CoG and Δf, group and site means with 95 % Student t intervals, the completion matrix and the site quality comparison',
  })
  get(@CurrentCaller() caller: Caller, @Param('studyId') studyId: string): StudyOverviewView {
    return this.overview.overview(caller, studyId);
  }
}
