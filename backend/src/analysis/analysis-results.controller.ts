import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiBearerAuth, ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { AnalysisRunDto, Page, QualityDto, RecordingResultsDto } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { PageQueryDto } from '../common/pagination/page-query.dto';
import { AnalysisRunsService } from './analysis-runs.service';
import { ResultsQueryDto } from './dto/results-query.dto';

@ApiTags('results')
@ApiBearerAuth()
@Controller('recordings/:recordingId')
export class AnalysisResultsController {
  constructor(private readonly runs: AnalysisRunsService) {}

  @Get('results')
  @RequirePermission('read', 'Result')
  @ApiOkResponse({
    description:
      'Onset curve (per channel and ROI, with CI), trial raster (≤ 500 points), rest spectrum with PAF/CoG, quality checks',
  })
  results(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Query() query: ResultsQueryDto,
  ): Promise<RecordingResultsDto> {
    return this.runs.results(caller, recordingId, query.runId);
  }

  @Get('runs')
  @RequirePermission('read', 'AnalysisRun')
  @ApiOkResponse({
    description: 'Runs of the recording with settings version, code version, checksum',
  })
  list(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Query() query: PageQueryDto,
  ): Promise<Page<AnalysisRunDto>> {
    return this.runs.listForRecording(caller, recordingId, query);
  }

  @Get('quality')
  @RequirePermission('read', 'Recording')
  @ApiOkResponse({ description: "The latest run's quality checks (null before a result exists)" })
  quality(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
  ): Promise<QualityDto | null> {
    return this.runs.quality(caller, recordingId);
  }
}
