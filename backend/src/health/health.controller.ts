import { Controller, Get, Res } from '@nestjs/common';
import { ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { Response } from 'express';
import { HealthReport } from '@gyre/shared';
import { Public } from '../common/decorators/public.decorator';
import { HealthService } from './health.service';

@ApiTags('health')
@Controller('health')
export class HealthController {
  constructor(private readonly health: HealthService) {}

  @Public()
  @Get()
  @ApiResult('HealthReport', { description: 'Database reachability, migration state and version' })
  async get(@Res({ passthrough: true }) response: Response): Promise<HealthReport> {
    const report = await this.health.report();
    if (report.status === 'down') response.status(503);
    return report;
  }
}
