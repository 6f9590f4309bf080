import { Controller, Query } from '@nestjs/common';
import { ApiOperation } from '@nestjs/swagger';
import type { OutboxMessageView, Page } from '@gyre/shared';
import { ListRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import { OutboxQueryDto } from './dto/outbox-query.dto';
import { OutboxService } from './outbox.service';

@ScopedController('mail', 'Admins only')
@Controller('mail')
export class MailController {
  constructor(private readonly outbox: OutboxService) {}

  @ListRoute('Outbox', 'OutboxMessageView', { path: 'outbox', description: 'The messages' })
  @ApiOperation({ summary: 'Outgoing e-mail and its delivery state (admins)' })
  list(@Query() query: OutboxQueryDto): Promise<Page<OutboxMessageView>> {
    return this.outbox.list(query);
  }
}
