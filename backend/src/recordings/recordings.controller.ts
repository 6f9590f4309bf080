import {
  Controller,
  Get,
  MessageEvent,
  Param,
  Post,
  Query,
  Req,
  Sse,
  StreamableFile,
  HttpStatus,
} from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiTags } from '@nestjs/swagger';
import { ApiFile, ApiResult } from '../openapi/api-responses';
import type { Request } from 'express';
import { map, Observable } from 'rxjs';
import type { Page, RecordingView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { VisitsService } from '../visits/visits.service';
import { RecordingListQueryDto } from './dto/recording-list-query.dto';
import { RecordingsService } from './recordings.service';
import { UploadReceiver } from './upload/upload-receiver';

@ApiTags('recordings')
@ApiBearerAuth()
@Controller()
export class RecordingsController {
  constructor(
    private readonly recordings: RecordingsService,
    private readonly visits: VisitsService,
    private readonly uploads: UploadReceiver,
  ) {}

  @Post('visits/:visitId/recordings')
  @RequirePermission('upload', 'Recording')
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['kind', 'file'],
      properties: {
        kind: { type: 'string', enum: ['resting', 'task'] },
        confirmKind: {
          type: 'string',
          enum: ['true', 'false'],
          description: 'true: keep the kind although the file looks like the other kind',
        },
        replaces: {
          type: 'string',
          description: "the visit's current recording of this kind that this file replaces",
        },
        replacementReason: { type: 'string', description: 'why (required with replaces)' },
        file: { type: 'string', format: 'binary', description: 'EDF or EDF+ recording' },
        onsets: {
          type: 'string',
          format: 'binary',
          description: 'optional onset_s,label CSV (task)',
        },
      },
    },
  })
  @ApiResult('RecordingView', {
    description:
      'Accepted and queued. 422 RECORDING_REJECTED (details.recording) for a bad file, 422 RECORDING_KIND_UNCONFIRMED when the file looks like the other kind, 409 RECORDING_KIND_TAKEN when the visit has a current recording of the kind (send replaces), 409 for a duplicate, 413 beyond UPLOAD_MAX_BYTES',
    status: HttpStatus.CREATED,
  })
  async upload(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Req() request: Request,
  ): Promise<RecordingView> {
    // The visit is found in the caller's scope before a byte of the body is read.
    const visit = await this.visits.findInScope(caller, 'read', visitId);
    return this.recordings.upload(caller, visit, await this.uploads.receive(request));
  }

  @Get('recordings')
  @RequirePermission('read', 'Recording')
  @ApiResult('RecordingView', {
    description: 'Recordings in scope; filter by visit, participant, site, state, kind',
    page: true,
  })
  list(
    @CurrentCaller() caller: Caller,
    @Query() query: RecordingListQueryDto,
  ): Promise<Page<RecordingView>> {
    return this.recordings.list(caller, query);
  }

  @Get('recordings/:recordingId')
  @RequirePermission('read', 'Recording')
  @ApiResult('RecordingView', {
    description: 'State, progress of the current job, validation facts or rejection',
  })
  get(@CurrentCaller() caller: Caller, @Param('recordingId') id: string): Promise<RecordingView> {
    return this.recordings.get(caller, id);
  }

  @Get('recordings/:recordingId/file')
  @RequirePermission('read', 'Recording')
  @ApiFile(
    'application/octet-stream',
    'The stored copy (patient field blanked), current or superseded; 404 once rejected',
  )
  async file(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') id: string,
  ): Promise<StreamableFile> {
    const file = await this.recordings.file(caller, id);
    return new StreamableFile(file.stream, {
      type: 'application/octet-stream',
      disposition: `attachment; filename="${file.fileName}"`,
      length: file.sizeBytes,
    });
  }

  @Sse('recordings/:recordingId/events')
  @RequirePermission('read', 'Recording')
  @ApiFile(
    'text/event-stream',
    'Server-Sent Events `recording`: state and progress until a final state',
  )
  async events(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') id: string,
  ): Promise<Observable<MessageEvent>> {
    const events = await this.recordings.events$(caller, id);
    return events.pipe(map((data) => ({ type: 'recording', data })));
  }

  @Post('recordings/:recordingId/retry')
  @RequirePermission('retry', 'Recording')
  @ApiResult('RecordingView', {
    description: 'Queues a failed recording again (audited)',
    status: HttpStatus.CREATED,
  })
  retry(@CurrentCaller() caller: Caller, @Param('recordingId') id: string): Promise<RecordingView> {
    return this.recordings.retry(caller, id);
  }
}
