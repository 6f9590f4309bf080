import { Controller, Get, Param } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { StudyOverviewView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { BlindingService } from '../blinding/blinding.service';
import { StudyOverviewService } from './study-overview.service';

@ApiTags('study-overview')
@ApiBearerAuth()
@Controller('studies/:studyId/overview')
export class StudyOverviewController {
  constructor(
    private readonly overview: StudyOverviewService,
    private readonly blinding: BlindingService,
  ) {}

  @Get()
  @RequirePermission('read', 'StudyOverview')
  @ApiResult('StudyOverviewView', {
    description:
      'Per planned visit: each participant’s PAF, CoG and Δf, group and site means with 95 % Student t intervals, the completion matrix and the site quality comparison; 403 to analysts while blinded review is on',
  })
  async get(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
  ): Promise<StudyOverviewView> {
    // It ties every visit to its planned visit, group and participant (blinded review).
    await this.blinding.assertStudyOpen(caller, studyId, 'the study overview is');
    return this.overview.overview(caller, studyId);
  }
}
