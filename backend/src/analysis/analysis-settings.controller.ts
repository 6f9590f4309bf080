import { Body, Controller, Get, Param, Post, Query, HttpStatus } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { AnalysisSettingsView, Page } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { PageQueryDto } from '../common/pagination/page-query.dto';
import { AnalysisSettingsService } from './analysis-settings.service';
import { AnalysisSettingsChangeDto } from './dto/analysis-settings-change.dto';

@ApiTags('analysis settings')
@ApiBearerAuth()
@Controller('studies/:studyId/analysis-settings')
export class AnalysisSettingsController {
  constructor(private readonly settings: AnalysisSettingsService) {}

  @Get()
  @RequirePermission('read', 'AnalysisSettings')
  @ApiResult('AnalysisSettingsView', { description: "The study's current settings version" })
  current(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
  ): Promise<AnalysisSettingsView> {
    return this.settings.current(caller, studyId);
  }

  @Get('versions')
  @RequirePermission('read', 'AnalysisSettings')
  @ApiResult('AnalysisSettingsView', {
    description: 'Every settings version, newest first by default',
    page: true,
  })
  versions(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Query() query: PageQueryDto,
  ): Promise<Page<AnalysisSettingsView>> {
    return this.settings.versions(caller, studyId, query);
  }

  @Post()
  @RequirePermission('create', 'AnalysisSettings')
  @ApiResult('AnalysisSettingsView', {
    description: 'A new settings version (audited); earlier runs keep theirs',
    status: HttpStatus.CREATED,
  })
  change(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Body() change: AnalysisSettingsChangeDto,
  ): Promise<AnalysisSettingsView> {
    return this.settings.change(caller, studyId, change);
  }
}
