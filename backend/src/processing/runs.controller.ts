import { Body, Controller, Param, Post, HttpStatus } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { JobView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { RerunDto } from './dto/rerun.dto';
import { RunsService } from './runs.service';

@ApiTags('analysis runs')
@ApiBearerAuth()
@Controller()
export class RunsController {
  constructor(private readonly runs: RunsService) {}

  @Post('recordings/:recordingId/runs')
  @RequirePermission('rerun', 'AnalysisRun')
  @ApiResult('JobView', {
    description: 'Queues the recording again with the current settings (audited)',
    status: HttpStatus.CREATED,
  })
  rerunRecording(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Body() body: RerunDto,
  ): Promise<JobView> {
    return this.runs.rerunRecording(caller, recordingId, body.reason ?? null);
  }

  @Post('visits/:visitId/runs')
  @RequirePermission('rerun', 'AnalysisRun')
  @ApiResult('JobView', {
    description: 'Queues every current ready or failed recording of the visit (audited)',
    array: true,
    status: HttpStatus.CREATED,
  })
  rerunVisit(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: RerunDto,
  ): Promise<JobView[]> {
    return this.runs.rerunVisit(caller, visitId, body.reason ?? null);
  }
}
