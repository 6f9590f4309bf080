import { Body, Controller, Get, Param, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { VisitAnalysisOverrideView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { VisitAnalysisOverrideChangeDto } from './dto/visit-analysis-override-change.dto';
import { VisitAnalysisOverridesService } from './visit-analysis-overrides.service';

@ApiTags('analysis settings')
@ApiBearerAuth()
@Controller('visits/:visitId/analysis-override')
export class VisitAnalysisOverrideController {
  constructor(private readonly overrides: VisitAnalysisOverridesService) {}

  @Get()
  @RequirePermission('read', 'AnalysisSettings')
  @ApiResult('VisitAnalysisOverrideView', {
    description: "The visit's own analysis choices (revision 0: none)",
  })
  get(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
  ): Promise<VisitAnalysisOverrideView> {
    return this.overrides.get(caller, visitId);
  }

  @Put()
  @RequirePermission('update', 'AnalysisSettings')
  @ApiResult('VisitAnalysisOverrideView', {
    description:
      'A new revision (audited, reason required) and a re-run of the visit; 409 ANALYSIS_OVERRIDE_UNCHANGED when nothing changes',
  })
  change(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() change: VisitAnalysisOverrideChangeDto,
  ): Promise<VisitAnalysisOverrideView> {
    return this.overrides.change(caller, visitId, change);
  }
}
