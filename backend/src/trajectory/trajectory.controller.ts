import { Controller, Get, Param } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { TrajectoryView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { TrajectoryService } from './trajectory.service';

@ApiTags('trajectory')
@ApiBearerAuth()
@Controller('participants/:participantId/trajectory')
export class TrajectoryController {
  constructor(private readonly trajectory: TrajectoryService) {}

  @Get()
  @RequirePermission('read', 'Result')
  @ApiResult('TrajectoryView', {
    description:
      'PAF, CoG and Δf per visit, change from the first visit, Theil–Sen slopes (Hz/year), flagged visits',
  })
  get(
    @CurrentCaller() caller: Caller,
    @Param('participantId') participantId: string,
  ): Promise<TrajectoryView> {
    return this.trajectory.forParticipant(caller, participantId);
  }
}
