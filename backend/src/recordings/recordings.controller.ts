import { Controller, Get, MessageEvent, Param, Post, Query, Req, Sse } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiBody,
  ApiConsumes,
  ApiCreatedResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { Request } from 'express';
import { map, Observable } from 'rxjs';
import type { Page, RecordingDto } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { RecordingListQueryDto } from './dto/recording-list-query.dto';
import { RecordingsService } from './recordings.service';

@ApiTags('recordings')
@ApiBearerAuth()
@Controller()
export class RecordingsController {
  constructor(private readonly recordings: RecordingsService) {}

  @Post('visits/:visitId/recordings')
  @RequirePermission('upload', 'Recording')
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['kind', 'file'],
      properties: {
        kind: { type: 'string', enum: ['resting', 'task'] },
        file: { type: 'string', format: 'binary', description: 'EDF or EDF+ recording' },
        onsets: {
          type: 'string',
          format: 'binary',
          description: 'optional onset_s,label CSV (task)',
        },
      },
    },
  })
  @ApiCreatedResponse({
    description:
      'Accepted and queued. 422 RECORDING_REJECTED (details.recording) for a bad file, 409 for a duplicate, 413 beyond UPLOAD_MAX_BYTES',
  })
  upload(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Req() request: Request,
  ): Promise<RecordingDto> {
    return this.recordings.upload(caller, visitId, request);
  }

  @Get('recordings')
  @RequirePermission('read', 'Recording')
  @ApiOkResponse({
    description: 'Recordings in scope; filter by visit, participant, site, state, kind',
  })
  list(
    @CurrentCaller() caller: Caller,
    @Query() query: RecordingListQueryDto,
  ): Promise<Page<RecordingDto>> {
    return this.recordings.list(caller, query);
  }

  @Get('recordings/:recordingId')
  @RequirePermission('read', 'Recording')
  @ApiOkResponse({
    description: 'State, progress of the current job, validation facts or rejection',
  })
  get(@CurrentCaller() caller: Caller, @Param('recordingId') id: string): Promise<RecordingDto> {
    return this.recordings.get(caller, id);
  }

  @Sse('recordings/:recordingId/events')
  @RequirePermission('read', 'Recording')
  @ApiOkResponse({
    description: 'Server-Sent Events `recording`: state and progress until a final state',
  })
  async events(
    @CurrentCaller() caller: Caller,
    @Param('recordingId') id: string,
  ): Promise<Observable<MessageEvent>> {
    const events = await this.recordings.events$(caller, id);
    return events.pipe(map((data) => ({ type: 'recording', data })));
  }

  @Post('recordings/:recordingId/retry')
  @RequirePermission('retry', 'Recording')
  @ApiCreatedResponse({ description: 'Queues a failed recording again (audited)' })
  retry(@CurrentCaller() caller: Caller, @Param('recordingId') id: string): Promise<RecordingDto> {
    return this.recordings.retry(caller, id);
  }
}
