import { Controller, Get, HttpStatus, Param, Post, Query } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { CalibrationRunView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { ApiResult } from '../openapi/api-responses';
import { CalibrationService } from './calibration.service';
import { LatestCalibrationQueryDto } from './dto/latest-calibration-query.dto';

@ApiTags('calibration')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@Controller()
export class CalibrationController {
  constructor(private readonly calibration: CalibrationService) {}

  @Post('sites/:siteId/calibration-runs')
  @RequirePermission('create', 'Calibration')
  @ApiResult('CalibrationRunView', {
    description: 'The run, queued: Gyre computes its calibration recording and compares',
    status: HttpStatus.CREATED,
  })
  @ApiNotFoundResponse({ description: 'No such site in your scope' })
  @ApiConflictResponse({ description: 'The site already has a run waiting or computing' })
  start(
    @CurrentCaller() caller: Caller,
    @Param('siteId') siteId: string,
  ): Promise<CalibrationRunView> {
    return this.calibration.start(caller, siteId);
  }

  @Get('sites/:siteId/calibration-runs')
  @RequirePermission('read', 'Calibration')
  @ApiResult('CalibrationRunView', { description: "The site's runs, newest first", array: true })
  @ApiNotFoundResponse({ description: 'No such site in your scope' })
  forSite(
    @CurrentCaller() caller: Caller,
    @Param('siteId') siteId: string,
  ): Promise<CalibrationRunView[]> {
    return this.calibration.forSite(caller, siteId);
  }

  @Get('calibration-runs/latest')
  @RequirePermission('read', 'Calibration')
  @ApiResult('CalibrationRunView', {
    description: 'The newest run of each site the caller may read',
    array: true,
  })
  latest(
    @CurrentCaller() caller: Caller,
    @Query() query: LatestCalibrationQueryDto,
  ): Promise<CalibrationRunView[]> {
    return this.calibration.latestPerSite(caller, query.studyId);
  }
}
