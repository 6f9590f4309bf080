import { Controller, Get, Query } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { OutboxMessageView, Page } from '@gyre/shared';
import { RequirePermission } from '../auth/decorators';
import { OutboxQueryDto } from './dto/outbox-query.dto';
import { OutboxPageDto } from './dto/outbox-responses.dto';
import { OutboxService } from './outbox.service';

@ApiTags('mail')
@ApiBearerAuth()
@Controller('mail')
export class MailController {
  constructor(private readonly outbox: OutboxService) {}

  @Get('outbox')
  @RequirePermission('read', 'Outbox')
  @ApiOperation({ summary: 'Outgoing e-mail and its delivery state (admins)' })
  @ApiOkResponse({ type: OutboxPageDto })
  @ApiForbiddenResponse({ description: 'Admins only' })
  list(@Query() query: OutboxQueryDto): Promise<Page<OutboxMessageView>> {
    return this.outbox.list(query);
  }
}
