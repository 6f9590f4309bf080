import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { Page, ReportView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { ReportListQueryDto } from './dto/report-list-query.dto';
import { ReportsService } from './reports.service';

@ApiTags('reports')
@ApiBearerAuth()
@Controller()
export class ReportsController {
  constructor(private readonly reports: ReportsService) {}

  @Get('reports')
  @RequirePermission('read', 'Report')
  @ApiResult('ReportView', {
    description: 'Reports in scope (coordinators: signed reports of their site)',
    page: true,
  })
  list(
    @CurrentCaller() caller: Caller,
    @Query() query: ReportListQueryDto,
  ): Promise<Page<ReportView>> {
    return this.reports.list(caller, query);
  }

  @Get('visits/:visitId/report')
  @RequirePermission('read', 'Report')
  @ApiResult('ReportView', { description: "The visit's report (a draft until signing exists)" })
  forVisit(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
  ): Promise<ReportView> {
    return this.reports.forVisit(caller, visitId);
  }
}
