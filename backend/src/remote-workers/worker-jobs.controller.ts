import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseIntPipe,
  Post,
  Res,
  StreamableFile,
} from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiConsumes,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import { ApiFile, ApiResult } from '../openapi/api-responses';
import type { Response } from 'express';
import type { WorkerPrincipal } from '../auth/auth-user';
import { CurrentWorker, RequirePermission } from '../auth/decorators';
import type { WorkerFailureView, WorkerResultView } from './dto/worker-answers';
import { WorkerFailureDto, WorkerProgressDto } from './dto/worker-job.dto';
import type { RemoteTask } from './remote-job';
import { RESULT_CONTENT_TYPE } from './result-wire';
import { WorkerJobsService } from './worker-jobs.service';

const attemptPipe = new ParseIntPipe({ errorHttpStatusCode: 400 });

/**
 * The worker API (with REDIS_URL): what `npm run worker` calls with a worker token. Routes
 * name one attempt of a job; any attempt that is not the job's current one is answered 409.
 */
@ApiTags('worker')
@ApiBearerAuth()
@ApiConflictResponse({ description: 'The attempt is no longer the job’s current one' })
@Controller('worker/jobs/:jobId/:attempt')
export class WorkerJobsController {
  constructor(private readonly jobs: WorkerJobsService) {}

  @Get('input')
  @RequirePermission('read', 'JobInput')
  @ApiOperation({ summary: 'The task to compute: settings, IAF, onsets, the file’s SHA-256' })
  @ApiResult('RemoteTask', { description: 'The attempt’s task' })
  input(
    @Param('jobId') jobId: string,
    @Param('attempt', attemptPipe) attempt: number,
  ): Promise<RemoteTask> {
    return this.jobs.task({ jobId, attempt });
  }

  @Get('file')
  @RequirePermission('read', 'JobInput')
  @ApiOperation({ summary: 'The stored recording (EDF); its SHA-256 is in X-Gyre-Sha256' })
  @ApiFile('application/octet-stream', 'The EDF file as stored (patient field blanked)')
  async file(
    @Param('jobId') jobId: string,
    @Param('attempt', attemptPipe) attempt: number,
    @Res({ passthrough: true }) response: Response,
  ): Promise<StreamableFile> {
    const file = await this.jobs.file({ jobId, attempt });
    response.setHeader('X-Gyre-Sha256', file.sha256);
    return new StreamableFile(file.stream, {
      type: 'application/octet-stream',
      length: file.sizeBytes,
    });
  }

  @Post('progress')
  @HttpCode(204)
  @RequirePermission('create', 'JobResult')
  @ApiOperation({ summary: 'How far the computation is (percent)' })
  async progress(
    @Param('jobId') jobId: string,
    @Param('attempt', attemptPipe) attempt: number,
    @Body() body: WorkerProgressDto,
  ): Promise<void> {
    await this.jobs.progress({ jobId, attempt }, body.percent);
  }

  @Post('result')
  @HttpCode(200)
  @RequirePermission('create', 'JobResult')
  @ApiConsumes(RESULT_CONTENT_TYPE)
  @ApiOperation({
    summary: 'The computation’s result: summary as JSON, series as base64 float64 (LE)',
  })
  @ApiResult('WorkerResultView', { description: 'What the server did with the result' })
  result(
    @Param('jobId') jobId: string,
    @Param('attempt', attemptPipe) attempt: number,
    @Body() body: unknown,
    @CurrentWorker() worker: WorkerPrincipal,
  ): Promise<WorkerResultView> {
    return this.jobs.result({ jobId, attempt }, body, worker);
  }

  @Post('failure')
  @HttpCode(200)
  @RequirePermission('create', 'JobResult')
  @ApiOperation({ summary: 'The computation failed: the attempt counts' })
  @ApiResult('WorkerFailureView', { description: 'The failure is recorded' })
  async failure(
    @Param('jobId') jobId: string,
    @Param('attempt', attemptPipe) attempt: number,
    @Body() body: WorkerFailureDto,
    @CurrentWorker() worker: WorkerPrincipal,
  ): Promise<WorkerFailureView> {
    await this.jobs.failure({ jobId, attempt }, body.message, worker);
    return { recorded: true };
  }
}
