import { Controller, Get, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { WorklistView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { WorklistQueryDto } from './dto/worklist-query.dto';
import { WorklistService } from './worklist.service';

@ApiTags('worklist')
@ApiBearerAuth()
@Controller('worklist')
export class WorklistController {
  constructor(private readonly worklist: WorklistService) {}

  @Get()
  @RequirePermission('read', 'Worklist')
  @ApiResult('WorklistView', {
    description:
      "What waits for the caller: analysts and monitors the study's review work, technicians their site's uploads; each section with its true count",
  })
  get(@CurrentCaller() caller: Caller, @Query() query: WorklistQueryDto): Promise<WorklistView> {
    return this.worklist.forCaller(caller, query);
  }
}
