import { Body, Controller, HttpCode, Param, Post, Query } from '@nestjs/common';
import { ApiConflictResponse, ApiNotFoundResponse, ApiOperation } from '@nestjs/swagger';
import type { CreatedWorkerTokenView, Page, WorkerTokenView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { CreateRoute, ListRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import { ApiResult } from '../openapi/api-responses';
import {
  CreateWorkerTokenDto,
  RevokeWorkerTokenDto,
  WorkerTokenQueryDto,
} from './dto/worker-token.dto';
import { WorkerTokensService } from './worker-tokens.service';

@ScopedController('worker-tokens', 'Admins only')
@Controller('worker-tokens')
export class WorkerTokensController {
  constructor(private readonly tokens: WorkerTokensService) {}

  @ListRoute('WorkerToken', 'WorkerTokenView', { description: 'The worker tokens' })
  @ApiOperation({ summary: 'Worker tokens, newest first (never their secrets)' })
  list(@Query() query: WorkerTokenQueryDto): Promise<Page<WorkerTokenView>> {
    return this.tokens.list(query);
  }

  @CreateRoute('WorkerToken', 'CreatedWorkerTokenView', {
    description: 'The new token with its secret',
    conflict: 'A live token has this name, or the name is reserved',
  })
  @ApiOperation({ summary: 'Creates a worker token; its secret is in this answer only' })
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
  @ApiResult('WorkerTokenView', { description: 'The revoked token' })
  @ApiNotFoundResponse({ description: 'No such worker token' })
  @ApiConflictResponse({ description: 'Already revoked' })
  revoke(
    @CurrentCaller() caller: Caller,
    @Param('id') id: string,
    @Body() body: RevokeWorkerTokenDto,
  ): Promise<WorkerTokenView> {
    return this.tokens.revoke(caller, id, body);
  }
}
