import {
  Controller,
  HttpCode,
  HttpStatus,
  Param,
  ParseUUIDPipe,
  Post,
  Query,
  Req,
  Res,
} from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiQuery, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { BidsImportPreview } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { ApiResult } from '../openapi/api-responses';
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
  async import(
    @CurrentCaller() caller: Caller,
    @Param('studyId', ParseUUIDPipe) studyId: string,
    @Query('dryRun') dryRun: string | undefined,
    @Req() request: Request,
    @Res({ passthrough: true }) response: Response,
  ): Promise<BidsImportPreview> {
    if (dryRun !== undefined && dryRun !== 'true' && dryRun !== 'false') {
      throw bidsImportError(
        BidsImportError.FormInvalid,
        `dryRun: '${dryRun}' found, 'true' or 'false' expected`,
        { field: 'dryRun' },
      );
    }
    // The study is found in the caller's scope before a byte of the body is read.
    await this.bids.assertStudy(caller, studyId);
    const received = await this.receiver.receive(request);
    try {
      const preview = await this.bids.run(caller, studyId, received, dryRun === 'true');
      if (preview.dryRun) response.status(200);
      return preview;
    } finally {
      await this.receiver.discard(received);
    }
  }
}
