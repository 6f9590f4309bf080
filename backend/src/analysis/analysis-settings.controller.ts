import { Body, Controller, Get, Param, Post, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiCreatedResponse, ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { AnalysisSettingsDto, Page } from '@gyre/shared';
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
  @ApiOkResponse({ description: "The study's current settings version" })
  current(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
  ): Promise<AnalysisSettingsDto> {
    return this.settings.current(caller, studyId);
  }

  @Get('versions')
  @RequirePermission('read', 'AnalysisSettings')
  @ApiOkResponse({ description: 'Every settings version, newest first by default' })
  versions(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Query() query: PageQueryDto,
  ): Promise<Page<AnalysisSettingsDto>> {
    return this.settings.versions(caller, studyId, query);
  }

  @Post()
  @RequirePermission('create', 'AnalysisSettings')
  @ApiCreatedResponse({ description: 'A new settings version (audited); earlier runs keep theirs' })
  change(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Body() change: AnalysisSettingsChangeDto,
  ): Promise<AnalysisSettingsDto> {
    return this.settings.change(caller, studyId, change);
  }
}
