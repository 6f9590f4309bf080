import { Controller, Get, Param, Query, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiNotFoundResponse, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { Response } from 'express';
import type { AnalysisRunView, Page, QualityView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { PageQueryDto } from '../common/pagination/page-query.dto';
import { AnalysisRunsService } from './analysis-runs.service';
import { ChannelCurveQueryDto } from './dto/channel-curve-query.dto';
import { ResultsQueryDto } from './dto/results-query.dto';
import { sendEncoded, type EncodedBody } from './encoded-body';

@ApiTags('results')
@ApiBearerAuth()
@Controller('recordings/:recordingId')
export class AnalysisResultsController {
  constructor(private readonly runs: AnalysisRunsService) {}

  // The results routes send bodies serialised and compressed once per run (see
  // AnalysisRunsService.resultsBody), so they write the response themselves (`send`).
  @Get('results')
  @RequirePermission('read', 'Result')
  @ApiResult('RecordingResultsView', {
    description:
      "RecordingResultsView: the region of interest onset curve with CI, rest spectrum with PAF/CoG, per-channel table, quality checks; series rounded as RESULT_SERIES_DECIMALS says. The raster and the channels' curves have routes of their own.",
  })
  async results(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Query() query: ResultsQueryDto,
    @Res() response: Response,
  ): Promise<void> {
    await send(response, this.runs.resultsBody(caller, recordingId, query.runId));
  }

  @Get('results/raster')
  @RequirePermission('read', 'Result')
  @ApiResult('TrialRasterView', {
    description:
      "TrialRasterView: the region of interest's trial raster (≤ 500 points) and per-trial Δf",
  })
  @ApiNotFoundResponse({ description: 'No such run, or a run without task results' })
  async raster(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Query() query: ResultsQueryDto,
    @Res() response: Response,
  ): Promise<void> {
    await send(response, this.runs.rasterBody(caller, recordingId, query.runId));
  }

  @Get('results/curves')
  @RequirePermission('read', 'Result')
  @ApiResult('OnsetCurveView', { description: "OnsetCurveView: one channel's onset curve with CI" })
  @ApiNotFoundResponse({ description: 'No such run, or no curve for that channel' })
  async channelCurve(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Query() query: ChannelCurveQueryDto,
    @Res() response: Response,
  ): Promise<void> {
    await send(
      response,
      this.runs.channelCurveBody(caller, recordingId, query.channel, query.runId),
    );
  }

  @Get('runs')
  @RequirePermission('read', 'AnalysisRun')
  @ApiResult('AnalysisRunView', {
    description: 'Runs of the recording with settings version, code version, checksum',
    page: true,
  })
  list(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
    @Query() query: PageQueryDto,
  ): Promise<Page<AnalysisRunView>> {
    return this.runs.listForRecording(caller, recordingId, query);
  }

  @Get('quality')
  @RequirePermission('read', 'Recording')
  @ApiResult('QualityView', {
    description: "The latest run's quality checks (null before a result exists)",
    nullable: true,
  })
  quality(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') recordingId: string,
  ): Promise<QualityView | null> {
    return this.runs.quality(caller, recordingId);
  }
}

/** Sends a body encoded once, in the encoding the request accepts (its `Accept-Encoding`). */
async function send(response: Response, body: Promise<EncodedBody>): Promise<void> {
  sendEncoded(response.req, response, await body);
}
