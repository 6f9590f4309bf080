import { Body, Controller, Param, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiCreatedResponse, ApiTags } from '@nestjs/swagger';
import type { JobDto } from '@gyre/shared';
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
  @ApiCreatedResponse({
    description: 'Queues the recording again with the current settings (audited)',
  })
  rerunRecording(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Body() body: RerunDto,
  ): Promise<JobDto> {
    return this.runs.rerunRecording(caller, recordingId, body.reason ?? null);
  }

  @Post('visits/:visitId/runs')
  @RequirePermission('rerun', 'AnalysisRun')
  @ApiCreatedResponse({
    description: 'Queues every current ready or failed recording of the visit (audited)',
  })
  rerunVisit(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: RerunDto,
  ): Promise<JobDto[]> {
    return this.runs.rerunVisit(caller, visitId, body.reason ?? null);
  }
}
