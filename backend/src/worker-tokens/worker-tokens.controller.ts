import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Query } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { CreatedWorkerTokenView, Page, WorkerTokenView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import {
  CreatedWorkerTokenResponseDto,
  CreateWorkerTokenDto,
  RevokeWorkerTokenDto,
  WorkerTokenPageDto,
  WorkerTokenQueryDto,
  WorkerTokenResponseDto,
} from './dto/worker-token.dto';
import { WorkerTokensService } from './worker-tokens.service';

@ApiTags('worker-tokens')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'Admins only' })
@Controller('worker-tokens')
export class WorkerTokensController {
  constructor(private readonly tokens: WorkerTokensService) {}

  @Get()
  @RequirePermission('read', 'WorkerToken')
  @ApiOperation({ summary: 'Worker tokens, newest first (never their secrets)' })
  @ApiOkResponse({ type: WorkerTokenPageDto })
  list(@Query() query: WorkerTokenQueryDto): Promise<Page<WorkerTokenView>> {
    return this.tokens.list(query);
  }

  @Post()
  @RequirePermission('create', 'WorkerToken')
  @ApiOperation({ summary: 'Creates a worker token; its secret is in this answer only' })
  @ApiCreatedResponse({ type: CreatedWorkerTokenResponseDto })
  @ApiConflictResponse({ description: 'A live token has this name, or the name is reserved' })
  create(
    @CurrentCaller() caller: Caller,
    @Body() body: CreateWorkerTokenDto,
  ): Promise<CreatedWorkerTokenView> {
    return this.tokens.create(caller, body);
  }

  @Post(':id/revoke')
  @HttpCode(200)
  @RequirePermission('update', 'WorkerToken')
  @ApiOperation({ summary: 'Revokes a worker token: it is refused from the next request on' })
  @ApiOkResponse({ type: WorkerTokenResponseDto })
  @ApiNotFoundResponse({ description: 'No such worker token' })
  @ApiConflictResponse({ description: 'Already revoked' })
  revoke(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: RevokeWorkerTokenDto,
  ): Promise<WorkerTokenView> {
    return this.tokens.revoke(caller, id, body);
  }
}
