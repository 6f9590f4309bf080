import {
  Controller,
  HttpCode,
  HttpStatus,
  Inject,
  Param,
  Post,
  Query,
  Req,
  Res,
} from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiQuery, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { Request, Response } from 'express';
import type { BulkUploadReport } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { runMultiFileImport } from '../common/http/multi-file-import';
import { StudiesService } from '../studies/studies.service';
import { BulkUploadReceiver } from './bulk-upload-receiver';
import { BulkUploadsError, bulkUploadsError } from './bulk-uploads.errors';
import { BulkUploadsService } from './bulk-uploads.service';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';

@ApiTags('bulk uploads')
@ApiBearerAuth()
@Controller('studies/:studyId/bulk-uploads')
export class BulkUploadsController {
  constructor(
    private readonly bulk: BulkUploadsService,
    private readonly receiver: BulkUploadReceiver,
    private readonly studies: StudiesService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
  ) {}

  @Post()
  @HttpCode(201)
  @RequirePermission('upload', 'Recording')
  @ApiConsumes('multipart/form-data')
  @ApiQuery({
    name: 'dryRun',
    required: false,
    enum: ['true', 'false'],
    description: 'true: check every row and answer 200 with the report; nothing is imported',
  })
  @ApiBody({
    schema: {
      type: 'object',
      required: ['manifest', 'files'],
      properties: {
        manifest: {
          type: 'string',
          format: 'binary',
          description:
            'CSV: participant_code, planned_visit, kind, file, onsets_file, visit_date, confirm_kind (docs/user-guide.md)',
        },
        files: {
          type: 'array',
          items: { type: 'string', format: 'binary' },
          description: 'the EDF/EDF+ recordings and onset CSVs (*.csv) the manifest names',
        },
      },
    },
  })
  @ApiResult('BulkUploadReport', {
    description:
      'Every row imported (visits, queued recordings, jobs) in one transaction. 422 BULK_UPLOAD_ROWS_INVALID (details.report) when any row fails: nothing imported. 422 BULK_UPLOAD_TOO_MANY_ROWS beyond BULK_UPLOAD_MAX_ROWS, 413 BULK_UPLOAD_TOO_LARGE beyond BULK_UPLOAD_MAX_BYTES or UPLOAD_MAX_BYTES, 400 for a bad form or manifest',
    status: HttpStatus.CREATED,
  })
  @ApiResult('BulkUploadReport', { description: 'Dry run: the per-row report, nothing imported' })
  upload(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Query('dryRun') dryRun: string | undefined,
    @Req() request: Request,
    @Res({ passthrough: true }) response: Response,
  ): Promise<BulkUploadReport> {
    return runMultiFileImport(request, response, dryRun, {
      receiver: this.receiver,
      badDryRun: (message) =>
        bulkUploadsError(BulkUploadsError.FormInvalid, message, { field: 'dryRun' }),
      assertStudy: () => this.studies.findInScope(caller, 'read', studyId),
      run: (received, dry) =>
        this.bulk.run(caller, studyId, received, {
          dryRun: dry,
          maxRows: this.config.bulkUploadMaxRows,
        }),
    });
  }
}
