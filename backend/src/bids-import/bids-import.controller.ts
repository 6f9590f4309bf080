import { Controller, HttpCode, HttpStatus, Param, Post, Query, Req, Res } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiQuery, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { BidsImportPreview } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { runMultiFileImport } from '../common/http/multi-file-import';
import { ApiResult } from '../openapi/api-responses';
import { StudiesService } from '../studies/studies.service';
import { BidsImportReceiver } from './bids-import-receiver';
import { BidsImportError, bidsImportError } from './bids-import.errors';
import { BidsImportService } from './bids-import.service';

@ApiTags('bids import')
@ApiBearerAuth()
@Controller('studies/:studyId/bids-imports')
export class BidsImportController {
  constructor(
    private readonly bids: BidsImportService,
    private readonly receiver: BidsImportReceiver,
    private readonly studies: StudiesService,
  ) {}

  @Post()
  @HttpCode(201)
  @RequirePermission('upload', 'Recording')
  @ApiConsumes('multipart/form-data')
  @ApiQuery({
    name: 'dryRun',
    required: false,
    enum: ['true', 'false'],
    description:
      'true: map and check every file and answer 200 with the preview; nothing is stored',
  })
  @ApiBody({
    schema: {
      type: 'object',
      properties: {
        files: {
          type: 'array',
          items: { type: 'string', format: 'binary' },
          description:
            "a BIDS folder's files, each part's file name its path in the folder (sub-*/ses-*/eeg/…)",
        },
        archive: { type: 'string', format: 'binary', description: 'or the folder as one zip' },
        createParticipants: {
          type: 'string',
          enum: ['true', 'false'],
          description: 'true: an unknown sub- label becomes a participant (default false)',
        },
        siteId: { type: 'string', description: "new participants' site (admins)" },
        visitDate: {
          type: 'string',
          description: 'YYYY-MM-DD for new visits when no scans.tsv gives acq_time',
        },
      },
    },
  })
  @ApiResult('BidsImportPreview', {
    description:
      'Every file imported in one transaction. 422 BIDS_IMPORT_FILES_INVALID (details.preview) when any file has a problem: nothing stored. 400 BIDS_IMPORT_PATH_UNSAFE for a path leaving the folder, 400 for a bad form or zip, 413 BIDS_IMPORT_TOO_LARGE, 409 BIDS_IMPORT_CONFLICT',
    status: HttpStatus.CREATED,
  })
  @ApiResult('BidsImportPreview', { description: 'Dry run: the preview, nothing stored' })
  import(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Query('dryRun') dryRun: string | undefined,
    @Req() request: Request,
    @Res({ passthrough: true }) response: Response,
  ): Promise<BidsImportPreview> {
    return runMultiFileImport(request, response, dryRun, {
      receiver: this.receiver,
      badDryRun: (message) =>
        bidsImportError(BidsImportError.FormInvalid, message, { field: 'dryRun' }),
      assertStudy: () => this.studies.findInScope(caller, 'read', studyId),
      run: (received, dry) => this.bids.run(caller, studyId, received, dry),
    });
  }
}
